/**
 * Diagnosis benchmark: full updates on the invented fan-drive board (fixtures/fan-drive.ts, 68 parts of which
 * 62 can fail; 181 fault modes, 614 sweep points).
 * A full update scores every candidate (no fault, all singles, pairs among the 12 strongest), builds the
 * posterior, evidence and minimal diagnoses, and ranks the next tests (about 80 candidate measurements).
 * - cold: a fresh diagnoser, every prediction simulated through the circuit engine;
 * - warm: the same diagnoser as the technician edits and adds readings whose predictions are cached (fault
 *   predictions per board state do not depend on the readings), i.e. what the server does per job update.
 * Prints median / p95 of the warm updates and the cold time.
 */
import { createDiagnoser, type CaseReading } from '../src/index';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive';

const base: CaseReading[] = [
  { mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 14.98 },
  { mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 0.05 },
  { mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: true },
];

const t0 = performance.now();
const d = createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });
const tBuild = performance.now() - t0;
const first = d.update(base);
const cold = performance.now() - t0;
const coldSolves = d.model.solves;

// Warm: reading values as a technician would type them (the rail voltage varies, the beep toggles).
const variants: CaseReading[][] = [];
for (let i = 0; i < 40; i++) {
  const v = [0.02, 0.05, 0.1, 0.3, 0.8, 14.9][i % 6] as number;
  variants.push([base[0]!, { ...base[1]!, value: v }, { ...base[2]!, value: i % 5 !== 0 }]);
}
const times: number[] = [];
for (const r of variants) {
  const t = performance.now();
  d.update(r);
  times.push(performance.now() - t);
}
times.sort((a, b) => a - b);
const q = (p: number) => times[Math.min(times.length - 1, Math.floor(p * times.length))] as number;

const parts = d.model.parts.length;
const modes = d.model.components.reduce((a, c) => a + c.modes.length, 0);
const points = d.model.components.reduce((a, c) => a + c.modes.reduce((b, m) => b + (m.points?.length ?? 1), 0), 0);
console.log(`board: ${parts} parts, ${d.model.components.length} that can fail, ${modes} fault modes, ${points} sweep points`);
console.log(`cold update (parse + build ${tBuild.toFixed(0)} ms, ${coldSolves} meter solves): ${cold.toFixed(0)} ms`);
console.log(
  `  top candidate ${first.candidates[0]?.faults.map((f) => `${f.part}:${f.mode}`).join('+')} p=${first.candidates[0]?.probability.toFixed(3)}; next: ${first.nextTests[0]?.instruction}`,
);
console.log(
  `warm full update (${times.length} runs, ${d.cache.size} cached predictions): median ${q(0.5).toFixed(1)} ms, p95 ${q(0.95).toFixed(1)} ms (target ≤ 50 ms median)`,
);
