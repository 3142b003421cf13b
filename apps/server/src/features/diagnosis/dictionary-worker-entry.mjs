// The dictionary builder's thread entry: as worker-entry.mjs, the TypeScript loader is registered first.
import { register } from 'tsx/esm/api';

register();
await import('./dictionary-worker.ts');
