/**
 * The fall-back chain of the DC operating point (the order SPICE uses): plain Newton, a cold retry after a stale
 * warm start, damped Newton, gmin stepping, source stepping.
 */
import type { Topology, Work } from './compile';
import { newton, type AttemptConfig, type AttemptResult } from './newton';

export type SolveMethod = 'linear' | 'newton' | 'damped' | 'gmin' | 'source';

export interface ChainResult extends AttemptResult {
  method: SolveMethod;
}

/**
 * Continuation: from x = 0, solves a sequence of easier problems, each started from the solution of the one before;
 * the last stage is the circuit itself. Stops at the first stage that does not converge.
 */
function stepThrough(top: Topology, w: Work, base: AttemptConfig, stages: readonly Partial<AttemptConfig>[]): AttemptResult {
  w.x.fill(0);
  let iterations = 0;
  for (let s = 0; s < stages.length; s++) {
    const r = newton(top, w, { ...base, ...stages[s], initJunctions: s === 0 });
    iterations += r.iterations;
    if (!r.ok) return { ok: false, iterations };
  }
  return { ok: true, iterations };
}

/** gmin stepping: a shunt from every node to the reference, 10 mS down to 0.1 pS, then none. */
const GMIN_STAGES: Partial<AttemptConfig>[] = [...Array.from({ length: 12 }, (_, i) => ({ gshunt: 10 ** (-2 - i) })), {}];

/** Source stepping: all independent sources ramped up in 20 steps (with twice the iterations per step). */
function sourceStages(maxIter: number): Partial<AttemptConfig>[] {
  return Array.from({ length: 20 }, (_, i) => ({ srcScale: (i + 1) / 20, maxIter: maxIter * 2 }));
}

/** Runs the chain from w.x (a warm start when `warm`). `iterations` counts every Newton iteration spent. */
export function solveChain(top: Topology, w: Work, base: AttemptConfig, warm: boolean): ChainResult {
  const nonlinear = top.dEl.length + top.qEl.length > 0;
  const start = warm ? new Float64Array(w.x) : undefined;
  let total = 0;
  let r = newton(top, w, base);
  total += r.iterations;
  if (r.singular !== undefined) return { ...r, iterations: total, method: 'linear' };
  if (r.ok) return { ...r, iterations: total, method: nonlinear ? 'newton' : 'linear' };
  if (warm) {
    // a stale warm start: retry cold
    w.x.fill(0);
    r = newton(top, w, { ...base, initJunctions: true });
    total += r.iterations;
    if (r.ok) return { ...r, iterations: total, method: 'newton' };
  }
  const attempts: [SolveMethod, () => AttemptResult][] = [
    [
      'damped',
      () => {
        if (start) w.x.set(start);
        else w.x.fill(0);
        return newton(top, w, { ...base, maxIter: base.maxIter * 4, maxStep: 1 });
      },
    ],
    ['gmin', () => stepThrough(top, w, base, GMIN_STAGES)],
    ['source', () => stepThrough(top, w, base, sourceStages(base.maxIter))],
  ];
  for (const [method, attempt] of attempts) {
    r = attempt();
    total += r.iterations;
    if (r.ok) return { ok: true, iterations: total, method };
  }
  return { ok: false, iterations: total, method: 'source' };
}
