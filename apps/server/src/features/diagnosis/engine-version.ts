import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/** Stored with every snapshot, so an old diagnosis can be told apart from what today's engine would say. */
export const ENGINE_VERSION = (() => {
  const pkg = JSON.parse(readFileSync(fileURLToPath(new URL('../../../../../packages/diagnosis/package.json', import.meta.url)), 'utf8')) as {
    name: string;
    version: string;
  };
  return `${pkg.name}@${pkg.version}`;
})();
