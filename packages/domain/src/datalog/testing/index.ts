export * from './generate-log';
