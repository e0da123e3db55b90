export * from './rental-states';
export * from './rental-dates';
export * from './rental-machine';
export * from './deposit-holds';
export * from './job-kit-guard';
