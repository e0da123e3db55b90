// The API's request and response shapes as zod schemas: the API validates and presents with them, the web types its calls with them.
export * from './envelope';
export * from './jobs';
export * from './files';
export * from './datalogs';
export * from './billing';
export * from './members';
export * from './me';
export * from './public';
export * from './reports';
export * from './rentals';
