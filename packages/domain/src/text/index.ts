export * from './name-text.rules';
