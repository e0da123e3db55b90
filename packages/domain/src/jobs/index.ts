export * from './job-states';
export * from './job-machine';
