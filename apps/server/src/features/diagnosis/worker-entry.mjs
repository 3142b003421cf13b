// The diagnosis thread's entry. Node 20 gives a worker thread none of the parent's module hooks, so TypeScript
// would not load there even when the server runs under tsx; the loader is registered first, then the worker.
import { register } from 'tsx/esm/api';

register();
await import('./worker.ts');
