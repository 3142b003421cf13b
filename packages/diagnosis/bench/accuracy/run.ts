/**
 * Accuracy bench of the diagnosis engine on board sections written apart from it (`pnpm bench:accuracy`).
 * Ground truth: ngspice on the faulted netlist through the bench's meter model (meter.ts), cached under .data/.
 * Options: `--case <substring>` to run some cases, `--seed <text>` for another draw of meter noise,
 * `--meter thevenin` for a bench meter whose test sources are the ones the engine is told (meter.ts).
 * Prints one row per case and the totals; exits 0 whatever the score (it is a benchmark).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { CASES } from './cases';
import { at } from './deck';
import { ngspiceAvailable, stats } from './ngspice';
import { CONFIDENT, runCase, type CaseResult } from './technician';

const arg = (name: string) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? process.argv[i + 1] : undefined;
};

if (!ngspiceAvailable()) {
  console.log('ngspice not found (Debian: apt-get install ngspice): the bench needs it for its ground truth.');
  process.exit(0);
}

const filter = arg('case');
const seed = arg('seed') ?? 'bench-1';
const meter = arg('meter') === 'thevenin' ? 'thevenin' : 'constant-current';
const cases = CASES.filter((c) => !filter || c.id.includes(filter));
const t0 = performance.now();
// Two cases at a time: one waits on ngspice while the other runs the engine.
const results: CaseResult[] = new Array(cases.length);
let next = 0;
await Promise.all(
  [0, 1].map(async () => {
    for (let i = next++; i < cases.length; i = next++) {
      const r = await runCase(at(cases, i), seed, meter);
      results[i] = r;
      process.stderr.write(`  ${r.id} done in ${r.seconds.toFixed(1)} s\n`);
    }
  }),
);

const passed = (r: CaseResult) => r.rank === 1 && !confidentWrong(r) && r.repeats === 0 && r.engineErrors.length === 0 && !r.groundTruthError;
const confidentWrong = (r: CaseResult) => r.topProbability >= CONFIDENT && r.rank !== 1;

const cols = ['case', 'true fault', 'engine top answer', 'p', 'rank', 'part rank', 'rounds', 'repeats', 'errors', 'end', 'unexpl.', 'ok'];
const rows = results.map((r) => [
  r.id,
  r.truth,
  r.top,
  r.topProbability.toFixed(2),
  r.rank ? String(r.rank) : '—',
  r.partRank ? String(r.partRank) : '—',
  String(r.rounds),
  String(r.repeats),
  String(r.engineErrors.length + (r.groundTruthError ? 1 : 0)),
  r.end,
  r.unexplained ? 'yes' : '',
  passed(r) ? 'yes' : 'NO',
]);
const width = cols.map((c, i) => Math.min(48, Math.max(c.length, ...rows.map((r) => at(r, i).length))));
const line = (cells: string[]) => cells.map((c, i) => (c.length > at(width, i) ? `${c.slice(0, at(width, i) - 1)}…` : c.padEnd(at(width, i)))).join('  ');
console.log(`\nSplitscope accuracy bench — seed ${seed}, ${meter} meter, ${cases.length} cases, confident at ≥ ${CONFIDENT}`);
console.log(line(cols));
console.log(width.map((w) => '-'.repeat(w)).join('  '));
for (const r of rows) console.log(line(r));

const n = results.length;
const count = (f: (r: CaseResult) => boolean) => results.filter(f).length;
console.log(
  `\nTOTAL ${count(passed)}/${n} pass · true fault first ${count((r) => r.rank === 1)}/${n} · confident and wrong ${count(confidentWrong)} · ` +
    `cases with a repeated test ${count((r) => r.repeats > 0)} (${results.reduce((s, r) => s + r.repeats, 0)} repeats) · ` +
    `engine errors ${results.reduce((s, r) => s + r.engineErrors.length, 0)} · ground-truth failures ${count((r) => !!r.groundTruthError)} · ` +
    `ended "not explained" ${count((r) => !!r.unexplained)} · ${((performance.now() - t0) / 1000).toFixed(0)} s ` +
    `(engine ${results.reduce((t, r) => t + r.engineSeconds, 0).toFixed(0)} s summed over cases), ngspice runs ${stats.runs} (cached ${stats.cached})`,
);
for (const r of results.filter((x) => x.engineErrors.length || x.groundTruthError)) {
  console.log(`  ${r.id}: ${[...r.engineErrors, ...(r.groundTruthError ? [r.groundTruthError] : [])].join('; ')}`);
}

// The readings of every case, for reading a failure afterwards (not part of the repository).
const out = join(import.meta.dirname, '..', '..', '..', '..', '.data', `accuracy-report-${meter}.json`);
mkdirSync(join(out, '..'), { recursive: true });
writeFileSync(out, JSON.stringify({ seed, meter, results }, null, 1));
console.log(`\nreadings of every case: .data/accuracy-report-${meter}.json`);
