/**
 * Fault dictionary benchmark (src/electrical/dictionary.ts) on the demo fan-drive board (fixtures/fan-drive.ts).
 * Prints: the dictionary build (every single fault on every offered test, through fast fault simulation from the
 * healthy factors per test, src/electrical/fast-predict.ts; wall and CPU time, and how many predictions took the
 * fast path, fell back inside it, or were solved in full) and the
 * diagnosis updates read from it on a fresh diagnoser, the first update of a new job included: p50 / p95 over
 * updates as a technician adds readings one at a time. Pairs the readings call for are taken out after each update
 * (the server computes them in the background), so the figures are what the bench waits for.
 * Figures depend on the machine's load: the load average is printed beside them.
 */
import { loadavg } from 'node:os';
import { attachDictionary, buildDictionary, createDiagnoser, takeWantedPairs, type CaseReading } from '../src/index';
import { FastPredictor } from '../src/electrical/fast-predict';
import { singleFaultsByPart } from '../src/electrical/dictionary';
import { ngspiceInstalled, sideBySide } from './ngspice-side';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive';

const load = () => loadavg()[0]!.toFixed(1);
const board = () => createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });

const t0 = performance.now();
const c0 = process.cpuUsage();
const builder = board();
const fast = new FastPredictor(builder.model);
let parts = 0;
const dict = buildDictionary(builder, { onProgress: (_done, total) => void (parts = total), predict: (f, ts) => fast.predict(f, ts) });
const build = performance.now() - t0;
const cpu = process.cpuUsage(c0).user / 1000;
const { fast: nFast, fallback, full } = fast.counts;
console.log(
  `dictionary build: ${parts} parts, ${dict.tests.length} tests × ${dict.faults.length} columns, ${builder.model.solves} meter readings (${nFast} from the healthy factors, ${fallback} fell back to a full solve, ${full} solved in full), ${build.toFixed(0)} ms wall, ${cpu.toFixed(0)} ms CPU (target ≤ 2 s; load average ${load()})`,
);

// Beside ngspice: every 8th single fault on every offered test, ours on a fresh board (its factors included).
if (ngspiceInstalled()) {
  const sample = singleFaultsByPart(builder.model)
    .flat()
    .filter((_f, i) => i % 8 === 0);
  const s = sideBySide(board().model, sample, dict.tests);
  console.log(
    `beside ngspice (${sample.length} faults × ${dict.tests.length} tests, ${s.pairs} decks, CPU time): ours ${s.oursMs.toFixed(0)} ms, ngspice re-solving each from scratch in one process ${s.ngspiceMs.toFixed(0)} ms: ${(s.ngspiceMs / s.oursMs).toFixed(1)}× (target ≥ 10×); ngspice's op alone ${s.ngspiceOpMs.toFixed(0)} ms (${(s.ngspiceOpMs / s.oursMs).toFixed(1)}×; load average ${load()})`,
  );
} else console.log('beside ngspice: ngspice not installed (Debian package ngspice)');

// A job's readings as a technician takes them: the rails powered, then unpowered checks of the fan supply.
const sequence: CaseReading[] = [
  { mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 14.98 },
  { mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 0.05 },
  { mode: 'dcv', red: 'bus', black: '0', power: 'on', value: 309 },
  { mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: true },
  { mode: 'ohm', red: 'vfan', black: '0', power: 'off', value: 0.4 },
  { mode: 'diode', red: '0', black: 'vfan', power: 'off', value: 0.01 },
];
const times: number[] = [];
const firsts: number[] = [];
for (let job = 0; job < 8; job++) {
  // A fresh diagnoser per job: the first update pays every cold cost there is once the dictionary is loaded.
  const d = board();
  attachDictionary(d, dict);
  for (let n = 1; n <= sequence.length; n++) {
    const t = performance.now();
    d.update(sequence.slice(0, n));
    const ms = performance.now() - t;
    times.push(ms);
    if (n === 1) firsts.push(ms);
    takeWantedPairs(d);
  }
}
const q = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(p * xs.length))]!;
console.log(
  `update from the dictionary (${times.length} updates, 8 fresh jobs): median ${q(times, 0.5).toFixed(1)} ms, p95 ${q(times, 0.95).toFixed(1)} ms; first update of a job: median ${q(firsts, 0.5).toFixed(1)} ms, max ${Math.max(...firsts).toFixed(1)} ms (target ≤ 20 ms p95; load average ${load()})`,
);
