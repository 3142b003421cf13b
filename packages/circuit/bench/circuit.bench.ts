/**
 * Circuit engine benchmark (not a timed test): `pnpm bench:circuit`.
 *
 * 1. DC operating-point solves per second for an invented ~60-part inverter fan-drive board section and for random
 *    10/50/100-node resistor+diode netlists, beside ngspice on the same netlists when ngspice is installed
 *    (bench/ngspice-rate.ts: one process, start-up and set-up subtracted). Ours, per solve:
 *    - first sight: the structure has never been seen (topology cache emptied), so the solve compiles it first;
 *    - cold: a fresh copy of the circuit, no warm start (the compiled structure is reused, as ngspice reuses its
 *      set-up between repeated `op`s) — a first reading on a board whose structure was compiled for another probe;
 *    - warm: started from the previous solution (`initialGuess`), as the diagnosis engine re-solves a variant.
 *    Rates come from CPU time on both sides (bench/timing.ts), so load from other processes matters less.
 * 2. The linear solve inside the Newton loop: mathjs `lusolve` against the typed-array LUs (src/lu.ts) on the same
 *    Jacobians (in the solver's minimum-degree order). Decision: the solver uses the typed-array LU — sparse with
 *    diagonal pivots along a cached fill-reducing order, falling back to dense partial pivoting when a pivot is weak —
 *    because it is two orders of magnitude faster than mathjs `lusolve` on every matrix measured here and allocates
 *    nothing per solve. The figures printed below are the evidence.
 */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { lusolve } from 'mathjs';
import { ngspiceAvailable, ngspiceVersion } from '../ngspice/ngspice';
import { clearTopologyCache } from '../src/structure-cache';
import { cloneCircuit, flatten, parseNetlist, solveOp, type Circuit } from '../src/index';
import { luFactor, luProgramFactor, luProgramSolve, luSolve, luWorkspace } from '../src/lu';
import { newtonSystem } from '../src/solver';
import { ngspicePerSecond } from './ngspice-rate';
import { randomNetlist } from './random';
import { timeIt } from './timing';

const here = dirname(fileURLToPath(import.meta.url));

interface Case {
  label: string;
  decks: string[];
}

const cases: Case[] = [
  { label: 'fan-drive section (~60 parts)', decks: [readFileSync(join(here, '..', 'ngspice', 'decks', 'fan-drive-section.cir'), 'utf8')] },
  { label: 'random 10-node R+D', decks: Array.from({ length: 20 }, (_, i) => randomNetlist(10, 1000 + i)) },
  { label: 'random 50-node R+D', decks: Array.from({ length: 20 }, (_, i) => randomNetlist(50, 2000 + i)) },
  { label: 'random 100-node R+D', decks: Array.from({ length: 20 }, (_, i) => randomNetlist(100, 3000 + i)) },
];

type Mode = 'first' | 'cold' | 'warm';

/** Our solves per second over the circuits in turn. */
function oursPerSecond(circuits: Circuit[], mode: Mode): number {
  const guesses = circuits.map((c) => solveOp(c).x);
  const ms = timeIt(() => {
    for (let i = 0; i < circuits.length; i++) {
      const c = circuits[i] as Circuit;
      if (mode === 'first') clearTopologyCache();
      if (mode === 'warm') solveOp(c, { initialGuess: guesses[i] });
      else solveOp(cloneCircuit(c));
    }
  });
  return (1000 * circuits.length) / ms;
}

function fmt(x: number): string {
  return x >= 100 ? Math.round(x).toLocaleString('en-US') : x.toFixed(1);
}

const withSpice = ngspiceAvailable();
console.log(`Splitscope circuit benchmark — node ${process.version}${withSpice ? `, ${ngspiceVersion()}` : ', ngspice not installed'}`);
console.log('');
console.log('DC operating point, solves per second of CPU time');
const head = ['netlists', 'Newton its (cold)', 'ours first sight', 'ours cold', 'ours warm'];
if (withSpice) head.push('ngspice', 'cold/ngspice', 'warm/ngspice');
console.log(head.join(' | '));
for (const c of cases) {
  const circuits = c.decks.map((d) => flatten(parseNetlist(d)));
  let iterations = 0;
  for (const circuit of circuits) {
    const r = solveOp(cloneCircuit(circuit));
    if (!r.converged) throw new Error(`a benchmark netlist did not converge: ${r.message ?? ''}`);
    iterations += r.iterations;
  }
  const first = oursPerSecond(circuits, 'first');
  const cold = oursPerSecond(circuits, 'cold');
  const warm = oursPerSecond(circuits, 'warm');
  const cells = [c.label, (iterations / circuits.length).toFixed(1), fmt(first), fmt(cold), fmt(warm)];
  if (withSpice) {
    const sp = ngspicePerSecond(c.decks);
    cells.push(fmt(sp), `${(cold / sp).toFixed(2)}×`, `${(warm / sp).toFixed(2)}×`);
  }
  console.log(cells.join(' | '));
}

console.log('');
console.log('Linear solve inside Newton (same Jacobians), microseconds of CPU per factor + solve');
console.log('matrix | n | non-zeros after fill | mathjs lusolve | typed-array dense LU | typed-array sparse LU (used) | mathjs/sparse');
for (const c of cases) {
  const sys = newtonSystem(flatten(parseNetlist(c.decks[0] as string)));
  if (!sys) continue;
  const { n, a, b, values, program } = sys;
  const rows: number[][] = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));
  const rhs = Array.from(b);
  const work = new Float64Array(n * n);
  const ws = luWorkspace(n);
  const x = new Float64Array(n);
  const mathjsMs = timeIt(() => {
    lusolve(rows, rhs);
  }, 200);
  const denseMs = timeIt(() => {
    work.set(a);
    if (luFactor(work, ws) >= 0) throw new Error('singular');
    luSolve(work, ws, b, x);
  }, 200);
  const sv = new Float64Array(values.length);
  const sx = new Float64Array(n);
  let sparseOk = true;
  const sparseMs = timeIt(() => {
    sv.set(values);
    sparseOk = luProgramFactor(sv, program);
    if (sparseOk) luProgramSolve(sv, program, b, sx);
  }, 200);
  // the solvers must agree before their speed means anything
  const ref = (lusolve(rows, rhs) as number[][]).map((r) => r[0] as number);
  const scale = Math.max(...ref.map((v) => Math.abs(v)));
  const err = Math.max(...ref.map((v, i) => Math.abs(v - (x[i] as number)))) / scale;
  if (err > 1e-6) throw new Error(`LU results disagree (${err})`);
  if (sparseOk) {
    const serr = Math.max(...ref.map((v, i) => Math.abs(v - (sx[i] as number)))) / scale;
    if (serr > 1e-6) throw new Error(`sparse LU result disagrees (${serr})`);
  }
  console.log(
    [
      c.label,
      n,
      program.nnz,
      (mathjsMs * 1000).toFixed(1),
      (denseMs * 1000).toFixed(2),
      sparseOk ? (sparseMs * 1000).toFixed(2) : 'dense fall-back',
      sparseOk ? `${(mathjsMs / sparseMs).toFixed(0)}×` : `${(mathjsMs / denseMs).toFixed(0)}×`,
    ].join(' | '),
  );
}
console.log('');
console.log('Kept: typed-array LU (see the comment at the top of this file).');
