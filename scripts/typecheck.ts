// Type-checks every project of the workspace, two at a time (the machine has two cores).
import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { runInherit } from './lib/proc';

const root = join(import.meta.dirname, '..');
const projects = [...['apps', 'packages'].flatMap((d) => readdirSync(join(root, d)).map((p) => join(d, p))), 'tests', 'scripts'].filter((p) =>
  existsSync(join(root, p, 'tsconfig.json')),
);

const tsc = join(root, 'node_modules', '.bin', 'tsc');
const queue = [...projects];
let failed: string[] = [];
await Promise.all(
  [0, 1].map(async () => {
    for (let p = queue.shift(); p; p = queue.shift()) {
      const code = await runInherit(tsc, ['-p', join(root, p, 'tsconfig.json'), '--pretty']);
      if (code !== 0) failed = [...failed, p];
    }
  }),
);
console.log(failed.length ? `typecheck failed in: ${failed.join(', ')}` : `typecheck ok (${projects.length} projects)`);
process.exit(failed.length ? 1 : 0);
