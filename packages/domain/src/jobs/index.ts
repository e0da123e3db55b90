export * from './job-states';
export * from './job-machine';
export * from './job-moves';
export * from './job.schemas';
