export * from './generate-log';
export * from './awkward-logs';
