// The one contract between the server and the web app: request/response schemas and their types.
// First: installs the validation messages (a zod error map) before any schema below is used.
import './messages';
export * from './auth';
export * from './problem';
export * from './common';
export * from './bounds';
export * from './customers';
export * from './users';
export * from './readings';
export * from './boards';
export * from './diagnosis';
export * from './reviews';
export * from './repairs';
export * from './uploads';
export * from './jobs';
export * from './billing';
export * from './board-model';
export * from './safety-gate';
export * from './shop';
export * from './meter-profiles';
export * from './policy-bench';
export * from './board-words';
export * from './verification';
export * from './policy';
export * from './duties';
export * from './report';
export * from './shop-memory';
