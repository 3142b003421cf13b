/**
 * The fall-back chain of the DC operating point, in the order ngspice's CKTop uses (ngspice source
 * src/spicelib/analysis/cktop.c; ngspice manual, "Convergence"): plain Newton, a cold retry after a stale warm start,
 * damped Newton, dynamic gmin stepping, dynamic (Gillespie) source stepping, then pseudo-transient continuation as
 * the last resort (Kelley & Keyes, "Convergence analysis of pseudo-transient continuation", SIAM J. Numer. Anal.
 * 35, 1998; Najm, "Circuit Simulation", Wiley 2010, ch. 5 on homotopy and continuation methods).
 */
import type { Topology, Work } from './system';
import { newton, type AttemptConfig, type AttemptResult } from './newton';

export type SolveMethod = 'linear' | 'newton' | 'damped' | 'gmin' | 'source' | 'ptc';

export interface ChainResult extends AttemptResult {
  method: SolveMethod;
  /** The strategies tried, in order (the last one is the one that succeeded when ok). */
  tried: SolveMethod[];
}

/** Iterations per continuation step (ngspice ITL2, the DC transfer-curve limit, default 50). */
const STEP_ITER = 50;

/** Runs one continuation step from the saved point; restores it when the step fails. */
function step(top: Topology, w: Work, cfg: AttemptConfig, saved: Float64Array, count: { n: number }): boolean {
  w.x.set(saved);
  const r = newton(top, w, cfg);
  count.n += r.iterations;
  if (r.ok) saved.set(w.x);
  return r.ok;
}

/**
 * Dynamic gmin stepping (ngspice cktop.c dynamic_gmin): a conductance from every node to the reference, starting at
 * 10 mS and divided by a factor that grows (×√factor, at most 10) after quick steps, shrinks (√factor) after slow
 * ones, and falls back to factor^¼ from the last good point after a failed step; gives up when the factor is below
 * 1.00005. The last step removes the shunt.
 */
function gminStepping(top: Topology, w: Work, base: AttemptConfig, count: { n: number }, srcScale = 1): boolean {
  const maxIter = Math.min(STEP_ITER, base.maxIter);
  const cfg = (gshunt: number): AttemptConfig => ({ ...base, srcScale, gshunt, maxIter, maxStep: Infinity, initJunctions: false });
  const saved = new Float64Array(w.x.length);
  w.x.fill(0);
  let g = 1e-2;
  let oldG = g;
  let factor = 10;
  const gtarget = 1e-12;
  let first = true;
  for (let guard = 0; guard < 400; guard++) {
    w.x.set(saved);
    const r = newton(top, w, { ...cfg(g), initJunctions: first });
    count.n += r.iterations;
    if (r.ok) {
      first = false;
      saved.set(w.x);
      if (g <= gtarget) break;
      if (r.iterations <= maxIter / 4) factor = Math.min(factor * Math.sqrt(factor), 10);
      if (r.iterations > (3 * maxIter) / 4) factor = Math.sqrt(factor);
      oldG = g;
      if (g < factor * gtarget) {
        factor = g / gtarget;
        g = gtarget;
      } else g /= factor;
    } else {
      if (first || factor < 1.00005) return false;
      factor = Math.sqrt(Math.sqrt(factor));
      g = oldG / factor;
    }
  }
  return step(top, w, { ...base, srcScale, initJunctions: false }, saved, count);
}

/**
 * Dynamic source stepping (ngspice cktop.c gillespie_src): all independent sources from 0 (solved plainly or by gmin
 * stepping) up to full value, the step growing ×1.5 after quick steps, halved after slow ones and cut ÷10 after a
 * failed one; gives up when the step falls below 1e-8 of full scale.
 */
function sourceStepping(top: Topology, w: Work, base: AttemptConfig, count: { n: number }): boolean {
  const maxIter = Math.min(STEP_ITER, base.maxIter);
  w.x.fill(0);
  let r = newton(top, w, { ...base, srcScale: 0, maxIter });
  count.n += r.iterations;
  if (!r.ok && !gminStepping(top, w, base, count, 0)) return false;
  const saved = new Float64Array(w.x);
  let done = 0;
  let raise = 1e-3;
  for (let guard = 0; guard < 2000 && done < 1; guard++) {
    const scale = Math.min(1, done + raise);
    w.x.set(saved);
    r = newton(top, w, { ...base, srcScale: scale, maxIter, initJunctions: false });
    count.n += r.iterations;
    if (r.ok) {
      saved.set(w.x);
      done = scale;
      if (r.iterations <= maxIter / 4) raise *= 1.5;
      if (r.iterations > (3 * maxIter) / 4) raise *= 0.5;
    } else {
      if (scale - done < 1e-8) return false;
      raise /= 10;
    }
  }
  return done >= 1;
}

/**
 * Pseudo-transient continuation (Kelley & Keyes 1998; ngspice's "optran" does the same with the circuit's own
 * capacitors): a capacitor from every node to the reference, integrated by backward Euler, so each step is a Newton
 * solve pulled towards the previous point by G = C/h. The pseudo time step h grows ×4 after quick steps, ×1.5 after
 * slow ones and shrinks ÷8 after a failed one; once G is below 1e-12 S a plain Newton solve ends it.
 */
function pseudoTransient(top: Topology, w: Work, base: AttemptConfig, count: { n: number }): boolean {
  const maxIter = Math.min(STEP_ITER, base.maxIter);
  w.x.fill(0);
  const ref = new Float64Array(w.x.length);
  let g = 1;
  let first = true;
  for (let guard = 0; guard < 600; guard++) {
    w.x.set(ref);
    const r = newton(top, w, { ...base, gshunt: g, ptcRef: ref, maxIter, initJunctions: first });
    count.n += r.iterations;
    if (r.ok) {
      first = false;
      ref.set(w.x);
      if (g < 1e-12) return step(top, w, { ...base, initJunctions: false }, ref, count);
      g /= r.iterations <= maxIter / 4 ? 4 : 1.5;
    } else {
      g *= 8;
      if (g > 1e6) return false;
    }
  }
  return false;
}

/** Runs the chain from w.x (a warm start when `warm`). `iterations` counts every Newton iteration spent. */
export function solveChain(top: Topology, w: Work, base: AttemptConfig, warm: boolean): ChainResult {
  const nonlinear = top.dEl.length + top.qEl.length > 0;
  const start = warm ? new Float64Array(w.x) : undefined;
  const tried: SolveMethod[] = [nonlinear ? 'newton' : 'linear'];
  let r = newton(top, w, base);
  const count = { n: r.iterations };
  if (r.singular !== undefined) return { ...r, iterations: count.n, method: 'linear', tried };
  if (r.ok) return { ...r, iterations: count.n, method: tried[0] as SolveMethod, tried };
  if (warm) {
    // a stale warm start: retry cold
    w.x.fill(0);
    r = newton(top, w, { ...base, initJunctions: true });
    count.n += r.iterations;
    if (r.ok) return { ...r, iterations: count.n, method: 'newton', tried };
  }
  const attempts: [SolveMethod, () => boolean][] = [
    [
      'damped',
      () => {
        if (start) w.x.set(start);
        else w.x.fill(0);
        const d = newton(top, w, { ...base, maxIter: base.maxIter * 2, maxStep: 1, initJunctions: !start });
        count.n += d.iterations;
        return d.ok;
      },
    ],
    ['gmin', () => gminStepping(top, w, base, count)],
    ['source', () => sourceStepping(top, w, base, count)],
    ['ptc', () => pseudoTransient(top, w, base, count)],
  ];
  for (const [method, attempt] of attempts) {
    tried.push(method);
    if (attempt()) return { ok: true, iterations: count.n, method, tried };
  }
  return { ok: false, iterations: count.n, method: 'ptc', tried };
}
