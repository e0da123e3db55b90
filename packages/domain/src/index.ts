export * from './errors';
