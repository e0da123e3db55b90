export * from './rental-states';
