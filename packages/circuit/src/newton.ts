/**
 * One Newton–Raphson run on a compiled system: each iteration copies the linear stamps, adds the companion models
 * of the junctions at the limited junction voltages, factors along the sparse LU program and checks convergence.
 */
import type { Topology, Work } from './system';
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
  /**
   * Pseudo-transient continuation: with gshunt > 0, the shunt of every node is a backward-Euler capacitor whose
   * companion source holds the node at this previous solution (index = solution index), instead of pulling it to 0.
   */
  ptcRef?: Float64Array;
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
  if (cfg.gshunt > 0) {
    const g = cfg.gshunt;
    for (let i = 0; i < top.shuntPos.length; i++) a[top.shuntPos[i] as number] = (a[top.shuntPos[i] as number] as number) + g;
    const ref = cfg.ptcRef;
    if (ref)
      for (let i = 0; i < top.shuntRow.length; i++)
        b[top.shuntRow[i] as number] = (b[top.shuntRow[i] as number] as number) + g * (ref[top.shuntX[i] as number] as number);
  }
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

/**
 * One step of iterative refinement (Golub & Van Loan, "Matrix Computations", 4th ed., §3.5.3; Wilkinson 1963):
 * residual r = b − A·x with the assembled matrix, correction A·d = r with the same factors, x += d. Used near
 * convergence only. The correction applied uses the residual summed with Dot2 (`residual`), accurate to twice the
 * working precision. The rounding floor (w.floor) that widens the convergence test is the correction a plainly
 * summed residual gives (`plainResidual`): the Newton steps that test judges are computed in plain arithmetic, so
 * their noise is that one, not the smaller error left after an accurate refinement. A node tied to the rest of the
 * circuit by gigaohms keeps a rounding noise larger than SPICE's VNTOL, and a Newton step within it is converged.
 */
function refineSolution(top: Topology, w: Work, solve: (r: Float64Array, d: Float64Array) => boolean | void): void {
  const { n, lu } = top;
  const { posRow, posCol, nnz } = lu;
  const r = (w.res ??= new Float64Array(n + 1));
  const d = (w.dx ??= new Float64Array(n + 1));
  const { xn } = w;
  plainResidual(w.asm, xn, w.b, posRow, posCol, nnz, r);
  if (solve(r, d) === false) return;
  const floor = (w.floor ??= new Float64Array(n));
  for (let i = 0; i < n; i++) floor[i] = Math.abs(d[i] as number);
  residual(w.asm, xn, w.b, posRow, posCol, nnz, r);
  if (solve(r, d) === false) return;
  for (let i = 0; i < n; i++) xn[i] = (xn[i] as number) + (d[i] as number);
  w.refined = true;
}

/** r = b − A·x summed in working precision, as the Newton iteration itself rounds. */
function plainResidual(a: Float64Array, x: Float64Array, b: Float64Array, posRow: Int32Array, posCol: Int32Array, nnz: number, r: Float64Array): void {
  r.set(b);
  for (let p = 0; p < nnz; p++) {
    const i = posRow[p] as number;
    r[i] = (r[i] as number) - (a[p] as number) * (x[posCol[p] as number] as number);
  }
}

/** Veltkamp's splitting constant 2^27 + 1: a double splits into two halves of 26 bits whose products are exact. */
const SPLIT = 134217729;

/**
 * r = b − A·x row by row with the Dot2 algorithm of Ogita, Rump & Oishi ("Accurate sum and dot product", SIAM J.
 * Sci. Comput. 26, 2005): every product split exactly by Dekker's TwoProduct (Veltkamp splitting; JavaScript has no
 * fused multiply-add) and summed with Knuth's TwoSum, the errors gathered apart. The residual is then as accurate as
 * if computed in twice the working precision, the classical condition for iterative refinement to improve a solution
 * (Wilkinson 1963; Higham, "Accuracy and Stability of Numerical Algorithms", 2nd ed., §12.1). Summed plainly, a node
 * tied by 57 S to its neighbour and by picosiemens to the rest of the circuit has a residual whose rounding (about
 * 1e-15 A out of products near 10 A) is a correction of 0.2 mV: the refinement then adds the noise it should remove.
 * Positions are numbered row after row, so each row is one run.
 */
function residual(a: Float64Array, x: Float64Array, b: Float64Array, posRow: Int32Array, posCol: Int32Array, nnz: number, r: Float64Array): void {
  let p = 0;
  while (p < nnz) {
    const i = posRow[p] as number;
    let s = b[i] as number;
    let c = 0;
    for (; p < nnz && posRow[p] === i; p++) {
      const av = a[p] as number;
      const xv = x[posCol[p] as number] as number;
      const prod = av * xv;
      // TwoProduct: av·xv = prod + perr exactly
      let t = SPLIT * av;
      const ah = t - (t - av);
      const al = av - ah;
      t = SPLIT * xv;
      const xh = t - (t - xv);
      const xl = xv - xh;
      const perr = al * xl - (prod - ah * xh - al * xh - ah * xl);
      // TwoSum: s + (−prod) = z + serr exactly
      const z = s - prod;
      const bb = z - s;
      const serr = s - (z - bb) + (-prod - bb);
      s = z;
      c += serr - perr;
    }
    const v = s + c;
    r[i] = Number.isFinite(v) ? v : s;
  }
}

/** Second pivot orders built per structure before the dense fall-back is left as it is (values that keep moving the pivots). */
const MAX_REPIVOTS = 4;

/**
 * Factors and solves along the compiled order, then the second one; false when both meet a weak pivot. The compiled
 * order always goes first, so a solve it can do gives the same digits whether or not a second order exists.
 */
function sparseSolve(top: Topology, w: Work): 0 | 1 | 2 {
  w.fac.set(w.asm);
  if (luProgramFactor(w.fac, top.lu, w.scale, w.asm)) {
    luProgramSolve(w.fac, top.lu, w.b, w.xn);
    return 1;
  }
  return w.repivot !== undefined && repivotSolve(w.repivot, w.asm, w.scale, w.b, w.xn) ? 2 : 0;
}

/**
 * Solves the assembled system into w.xn: sparse along the compiled program or the structure's second order
 * (repivot.ts), densely with pivoting when a pivot is weak in both.
 */
function linearSolve(top: Topology, w: Work, shunted: boolean, refine: boolean): number {
  const { lu } = top;
  if (shunted) luColumnScale(w.asm, lu, w.scale);
  else columnScale(top, w);
  const sparse = sparseSolve(top, w);
  if (sparse > 0) {
    // w.fac holds the factors of the compiled order; the second order factors again (near convergence only)
    if (refine && sparse === 1) refineSolution(top, w, (r, d) => luProgramSolve(w.fac, lu, r, d));
    else if (refine && w.repivot) {
      const rp = w.repivot;
      refineSolution(top, w, (r, d) => repivotSolve(rp, w.asm, w.scale, r, d));
    }
    return -1;
  }
  w.denseFallbacks++;
  const n = top.n;
  if (!w.dense) w.dense = { a: new Float64Array(n * n), ws: luWorkspace(n) };
  const { a, ws } = w.dense;
  luProgramToDense(w.asm, lu, a);
  const sing = luFactor(a, ws);
  if (sing >= 0) return sing;
  luSolve(a, ws, w.b, w.xn);
  if (refine) refineSolution(top, w, (r, d) => luSolve(a, ws, r, d));
  // the rows chosen here become the structure's second sparse order (a few tries, then dense stays the way)
  if (w.repivots < MAX_REPIVOTS) {
    w.repivots++;
    w.repivot = repivot(lu, ws.perm);
  }
  return -1;
}

/** SPICE's default voltage tolerances (ngspice manual, .options RELTOL, VNTOL; Nagel 1975 ch. 4): near enough to refine. */
const LOOSE_RELTOL = 1e-3;
const LOOSE_VNTOL = 1e-6;
/** A Newton step within this many times the estimated rounding error of the solve is noise, not progress. */
const NOISE_FACTOR = 4;

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
  let refine = false;
  for (let iter = 1; iter <= cfg.maxIter; iter++) {
    const first = iter === 1;
    let limited = assemble(top, w, cfg, first);
    if (cfg.capture) cfg.capture(w.asm, w.b);
    const sing = linearSolve(top, w, cfg.gshunt > 0, refine);
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
    // converged: every step within the tolerance (tight by default), widened by NOISE_FACTOR × the rounding error
    // the refinement estimated, when it ran (a node tied to the rest by gigaohms keeps a rounding noise above the
    // tolerance, and Newton never settles below it)
    let conv = !limited && !first;
    let loose = conv;
    const floor = w.refined ? w.floor : undefined;
    w.refined = false;
    for (let i = 0; i < n; i++) {
      const xo = x[i] as number;
      const xv = xn[i] as number;
      if (!Number.isFinite(xv)) return { ok: false, iterations: iter };
      if (loose) {
        const d = Math.abs(xv - xo);
        const big = Math.max(Math.abs(xo), Math.abs(xv));
        const noise = floor ? NOISE_FACTOR * (floor[i] as number) : 0;
        if (conv && d > cfg.reltol * big + (isNode[i] ? cfg.vntol : cfg.abstol) + noise) conv = false;
        if (isNode[i] && d > LOOSE_RELTOL * big + LOOSE_VNTOL + noise) loose = conv = false;
      }
      x[i] = xv;
    }
    if (conv) return { ok: true, iterations: iter };
    // within SPICE's own tolerance: refine the next solve, which also estimates its rounding error
    refine = loose;
  }
  return { ok: false, iterations: cfg.maxIter };
}
