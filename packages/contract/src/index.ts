// The one contract between the server and the web app: request/response schemas and their types.
export * from './auth';
export * from './problem';
