// `pnpm circuit …`: the circuit package's command line (packages/circuit/src/cli.ts) run from a bundle, so a call
// starts without compiling TypeScript (tsx compiles every module it loads on each start, about 2 s of the old
// start-up). esbuild writes the bundle to packages/circuit/dist/cli; mathjs stays outside it and loads only when a
// netlist has expressions, as in cli.ts. Whenever a source file of the package is newer than the bundle (and on
// `pnpm build:cli`), the bundle is rebuilt first, so a call never runs code older than the tree.
import { readdirSync, rmSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const src = join(root, 'packages/circuit/src');
const outdir = join(root, 'packages/circuit/dist/cli');
const bundle = join(outdir, 'cli.mjs');

/** Newest modification time of the package's source files (tests left out: they are not in the bundle). */
function newestSource(dir) {
  let t = 0;
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) t = Math.max(t, newestSource(p));
    else if (e.name.endsWith('.ts') && !e.name.endsWith('.test.ts')) t = Math.max(t, statSync(p).mtimeMs);
  }
  return t;
}

function mtime(p) {
  try {
    return statSync(p).mtimeMs;
  } catch {
    return -1;
  }
}

async function buildCli() {
  const { build } = await import('esbuild');
  rmSync(outdir, { recursive: true, force: true }); // chunk names carry a hash: old ones would pile up
  await build({
    entryPoints: [join(src, 'cli.ts')],
    outdir,
    bundle: true,
    // The expression engine is a dynamic import in cli.ts: its own chunk, loaded only when a netlist needs it.
    splitting: true,
    format: 'esm',
    platform: 'node',
    target: 'node20',
    packages: 'external',
    outExtension: { '.js': '.mjs' },
    logLevel: 'warning',
  });
}

const argv = process.argv.slice(2);
const buildOnly = argv[0] === '--build';
if (buildOnly || mtime(bundle) < newestSource(src)) await buildCli();
if (!buildOnly) {
  const { main } = await import(pathToFileURL(bundle).href);
  process.exitCode = await main(argv);
}
