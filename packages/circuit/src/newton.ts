/**
 * One Newton–Raphson run on a compiled system: each iteration copies the linear stamps, adds the companion models
 * of the junctions at the limited junction voltages, factors along the sparse LU program and checks convergence.
 */
import type { Topology, Work } from './compile';
import { stampJunctions } from './devices';
import { luColumnScale, luFactor, luProgramFactor, luProgramSolve, luProgramToDense, luSolve, luWorkspace } from './lu';
import { repivot, repivotSolve } from './repivot';

export interface AttemptConfig {
  maxIter: number;
  srcScale: number;
  gshunt: number;
  maxStep: number;
  reltol: number;
  vntol: number;
  abstol: number;
  /** First iteration sets junctions to their critical voltages (SPICE MODEINITJCT) instead of from x. */
  initJunctions: boolean;
  /** Called with the assembled compressed Jacobian and right-hand side before each factorisation (benchmark use). */
  capture?: (a: Float64Array, b: Float64Array) => void;
}

export interface AttemptResult {
  ok: boolean;
  iterations: number;
  /** Solution index of a column found singular. */
  singular?: number;
}

/** Assembles w.asm / w.b: linear part, optional shunt, then the junctions at their (limited) voltages; true if limited. */
function assemble(top: Topology, w: Work, cfg: AttemptConfig, first: boolean): boolean {
  const { asm: a, b, rhs0 } = w;
  a.set(w.base);
  const scale = cfg.srcScale;
  for (let i = 0; i < b.length; i++) b[i] = scale * (rhs0[i] as number);
  if (cfg.gshunt > 0) for (let i = 0; i < top.shuntPos.length; i++) a[top.shuntPos[i] as number] = (a[top.shuntPos[i] as number] as number) + cfg.gshunt;
  return stampJunctions(top, w, first);
}

/**
 * Column scales of the assembled matrix without a pass over every entry: the linear part's scales (computed once
 * per solve) raised by the entries the junctions stamp into. An upper bound of the exact scales (a junction stamp
 * can only cancel part of a linear entry), so the singularity test stays at least as strict.
 */
function columnScale(top: Topology, w: Work): void {
  w.scale.set(w.scale0);
  raiseScale(top, w, top.dPos);
  raiseScale(top, w, top.qPos);
}

/** Raises the column scales to the junction entries at positions `pos` (a function, not a closure: it runs per iteration). */
function raiseScale(top: Topology, w: Work, pos: Int32Array): void {
  const { scale, asm } = w;
  const { posCol, nnz } = top.lu;
  for (let t = 0; t < pos.length; t++) {
    const p = pos[t] as number;
    if (p >= nnz) continue;
    const c = posCol[p] as number;
    const a = Math.abs(asm[p] as number);
    if (a > (scale[c] as number)) scale[c] = a;
  }
}

/** Second pivot orders built per structure before the dense fall-back is left as it is (values that keep moving the pivots). */
const MAX_REPIVOTS = 4;

/**
 * Factors and solves along the compiled order, then the second one; false when both meet a weak pivot. The compiled
 * order always goes first, so a solve it can do gives the same digits whether or not a second order exists.
 */
function sparseSolve(top: Topology, w: Work): boolean {
  w.fac.set(w.asm);
  if (luProgramFactor(w.fac, top.lu, w.scale)) {
    luProgramSolve(w.fac, top.lu, w.b, w.xn);
    return true;
  }
  return w.repivot !== undefined && repivotSolve(w.repivot, w.asm, w.scale, w.b, w.xn);
}

/**
 * Solves the assembled system into w.xn: sparse along the compiled program or the structure's second order
 * (repivot.ts), densely with pivoting when a pivot is weak in both.
 */
function linearSolve(top: Topology, w: Work, shunted: boolean): number {
  const { lu } = top;
  if (shunted) luColumnScale(w.asm, lu, w.scale);
  else columnScale(top, w);
  if (sparseSolve(top, w)) return -1;
  w.denseFallbacks++;
  const n = top.n;
  if (!w.dense) w.dense = { a: new Float64Array(n * n), ws: luWorkspace(n) };
  const { a, ws } = w.dense;
  luProgramToDense(w.asm, lu, a);
  const sing = luFactor(a, ws);
  if (sing >= 0) return sing;
  luSolve(a, ws, w.b, w.xn);
  // the rows chosen here become the structure's second sparse order (a few tries, then dense stays the way)
  if (w.repivots < MAX_REPIVOTS) {
    w.repivots++;
    w.repivot = repivot(lu, ws.perm);
  }
  return -1;
}

/** Runs Newton–Raphson from w.x (w.x[n] is the reference and stays 0). */
export function newton(top: Topology, w: Work, cfg: AttemptConfig): AttemptResult {
  const { n, isNode } = top;
  const { x, xn } = w;
  const nonlinear = top.dEl.length + top.qEl.length > 0;
  x[n] = 0;
  xn[n] = 0;
  // junction states from the start point
  for (let i = 0; i < top.dEl.length; i++) {
    w.dVold[i] = cfg.initJunctions ? (w.dVcrit[i] as number) : (x[top.dX[2 * i] as number] as number) - (x[top.dX[2 * i + 1] as number] as number);
  }
  for (let i = 0; i < top.qEl.length; i++) {
    const pol = w.qPol[i] as number;
    const xb = x[top.qX[3 * i + 1] as number] as number;
    w.qVbe[i] = cfg.initJunctions ? (w.qVcrit[i] as number) : pol * (xb - (x[top.qX[3 * i + 2] as number] as number));
    w.qVbc[i] = cfg.initJunctions ? 0 : pol * (xb - (x[top.qX[3 * i] as number] as number));
  }
  for (let iter = 1; iter <= cfg.maxIter; iter++) {
    const first = iter === 1;
    let limited = assemble(top, w, cfg, first);
    if (cfg.capture) cfg.capture(w.asm, w.b);
    const sing = linearSolve(top, w, cfg.gshunt > 0);
    if (sing >= 0) return { ok: false, iterations: iter, singular: sing };
    if (!nonlinear) {
      x.set(xn.subarray(0, n));
      return { ok: true, iterations: iter };
    }
    // damping (fall-back attempts only): limit the largest node-voltage step
    if (cfg.maxStep < Infinity) {
      let maxd = 0;
      for (let i = 0; i < n; i++) if (isNode[i]) maxd = Math.max(maxd, Math.abs((xn[i] as number) - (x[i] as number)));
      if (maxd > cfg.maxStep) {
        const f = cfg.maxStep / maxd;
        for (let i = 0; i < n; i++) xn[i] = (x[i] as number) + f * ((xn[i] as number) - (x[i] as number));
        limited = true;
      }
    }
    let conv = !limited && !first;
    for (let i = 0; i < n; i++) {
      const xo = x[i] as number;
      const xv = xn[i] as number;
      if (!Number.isFinite(xv)) return { ok: false, iterations: iter };
      if (conv) {
        const tol = cfg.reltol * Math.max(Math.abs(xo), Math.abs(xv)) + (isNode[i] ? cfg.vntol : cfg.abstol);
        if (Math.abs(xv - xo) > tol) conv = false;
      }
      x[i] = xv;
    }
    if (conv) return { ok: true, iterations: iter };
  }
  return { ok: false, iterations: cfg.maxIter };
}
