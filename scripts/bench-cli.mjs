// `pnpm bench:cli`: wall time of `circuit op` on a small netlist, from process start to exit, 10 runs each: the
// bundled command (scripts/circuit.mjs, what `pnpm circuit` runs), the same through `pnpm circuit` (pnpm's own
// start added), and the TypeScript source through tsx (how the command ran before the bundle). Prints the median and
// the range. The bundle is built first, outside the timing. Target (issue 15): under 300 ms for `pnpm circuit op`.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const RUNS = 10;
const deck = join(mkdtempSync(join(tmpdir(), 'cli-bench-')), 'small.cir');
writeFileSync(deck, 'divider with a diode clamp\nV1 in 0 DC 12\nR1 in mid 10k\nR2 mid 0 4.7k\nD1 mid 0 DX\n.model DX D(is=1e-14 n=1)\n.end\n');

function time(cmd, args) {
  const ms = [];
  for (let i = 0; i < RUNS; i++) {
    const t0 = process.hrtime.bigint();
    const r = spawnSync(cmd, args, { cwd: root, encoding: 'utf8' });
    ms.push(Number(process.hrtime.bigint() - t0) / 1e6);
    if (r.status !== 0 || !r.stdout.includes('"converged":true')) throw new Error(`${cmd} ${args.join(' ')} failed: ${r.stderr || r.stdout}`);
  }
  ms.sort((a, b) => a - b);
  return { median: (ms[RUNS / 2 - 1] + ms[RUNS / 2]) / 2, min: ms[0], max: ms[RUNS - 1] };
}

const pnpm = join(root, '.tools/node_modules/.bin/pnpm');
const tsx = join(root, 'node_modules/.bin/tsx');
spawnSync(process.execPath, ['scripts/circuit.mjs', '--build'], { cwd: root, stdio: 'inherit' });
const rows = [
  ['node scripts/circuit.mjs op (bundle)', time(process.execPath, ['scripts/circuit.mjs', 'op', deck])],
  ['pnpm circuit op', time(pnpm, ['--silent', 'circuit', 'op', deck])],
  ['tsx packages/circuit/src/cli.ts op (before)', time(tsx, ['packages/circuit/src/cli.ts', 'op', deck])],
];
const f = (x) => `${Math.round(x)} ms`;
console.log(`circuit op on a 4-element netlist, wall time over ${RUNS} runs (median, min – max):`);
for (const [name, t] of rows) console.log(`  ${name.padEnd(46)} ${f(t.median).padStart(8)}   ${f(t.min)} – ${f(t.max)}`);
