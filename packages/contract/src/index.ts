// The API's request and response shapes as zod schemas: the API validates and presents with them, the web types its calls with them.
export * from './customers';
export * from './vehicles';
