export * from './auth';
export * from './customers';
export * from './boards';
export * from './jobs';
export * from './billing';
export * from './rules';
export * from './shop-memory';
