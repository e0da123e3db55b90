export * from './report-range';
