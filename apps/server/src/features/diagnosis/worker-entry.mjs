// The diagnosis thread's entry, as the pool library loads it. Node 20 gives a worker thread none of the parent's
// module hooks, so TypeScript would not load there even when the server runs under tsx; the loader is registered
// first, then the worker, whose handler this module hands to the pool.
import { register } from 'tsx/esm/api';

register();
const { default: answer } = await import('./worker.ts');
export default answer;
