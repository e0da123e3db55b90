export * from './csv-writer';
