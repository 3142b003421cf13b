/**
 * A second pivot order for a structure whose fill-reducing order meets a weak diagonal pivot. The order is fixed
 * when the structure is compiled, before any value is known; some values make a diagonal tiny against its column
 * (an opto LED that is off leaves its anode node with only the junction's pA-level conductance beside the ±1 of a
 * current-sense source). SPICE's sparse solver then re-orders and keeps the new order for the factorisations that
 * follow (Kundert, "Sparse Matrix Techniques", in Circuit Analysis, Simulation and Design, 1986). Here the rows the
 * dense pivoting fall-back (luFactor) chose become a second compiled program, so the later solves of the structure
 * (Newton iterations, fault sweep points, warm variants) stay sparse instead of paying a dense factorisation each.
 *
 * The second order is used only when luFactor would pick the very same pivot rows for the matrix at hand: each step
 * replays its choice (largest entry of the column, first in its row order on a tie, the diagonal kept when within
 * 1e-3 of it) and gives up at the first difference. The arithmetic is then luFactor's own, operation for operation,
 * so a solve gives the same digits as the dense fall-back it replaces.
 */
import { eliminateColumn, luProgram, luProgramSolve, type LuProgram } from './lu';

/** luFactor's threshold pivoting: it keeps the diagonal when |diagonal| ≥ this × the largest entry below it. */
const KEEP_DIAGONAL = 1e-3;

export interface Repivot {
  lu: LuProgram;
  /** Position in this program of every position of the compiled one. */
  map: Int32Array;
  /** Row k of this program is row perm[k] of the compiled one. */
  perm: Int32Array;
  v: Float64Array;
  b: Float64Array;
  /** Replay of luFactor's row order: compiled row at each position, and the position of each compiled row. */
  order: Int32Array;
  where: Int32Array;
}

/** The program for the compiled matrix with its rows permuted by `perm` (as left by luFactor); columns keep their order. */
export function repivot(lp: LuProgram, perm: Int32Array): Repivot {
  const { n, nnz, posRow, posCol } = lp;
  const rowOf = new Int32Array(n);
  for (let k = 0; k < n; k++) rowOf[perm[k] as number] = k;
  const at = (t: number) => (rowOf[posRow[t] as number] as number) * n + (posCol[t] as number);
  const nz = new Uint8Array(n * n);
  for (let t = 0; t < nnz; t++) nz[at(t)] = 1;
  const { program, posOf } = luProgram(n, nz);
  const map = new Int32Array(nnz);
  for (let t = 0; t < nnz; t++) map[t] = posOf[at(t)] as number;
  const f = new Float64Array(program.nnz);
  return { lu: program, map, perm: perm.slice(0, n), v: f, b: new Float64Array(n), order: new Int32Array(n), where: new Int32Array(n) };
}

/**
 * Factors the compiled values `asm` along the second order and solves into x. False as soon as luFactor would pivot
 * differently (or find the matrix singular, or meet a NaN): the caller then factors densely. `scale` is the column
 * scale of the assembled matrix or an upper bound of it (a larger bound only sends more borderline cases dense).
 */
export function repivotSolve(r: Repivot, asm: Float64Array, scale: Float64Array, b: Float64Array, x: Float64Array): boolean {
  const { v, map, perm, lu, order, where } = r;
  const { n, diag, lStart, lRow, lPos } = lu;
  v.fill(0);
  for (let t = 0; t < map.length; t++) v[map[t] as number] = asm[t] as number;
  for (let i = 0; i < n; i++) {
    order[i] = i;
    where[i] = i;
  }
  let tp = 0;
  for (let k = 0; k < n; k++) {
    const r0 = lStart[k] as number;
    const r1 = lStart[k + 1] as number;
    const piv = v[diag[k] as number] as number;
    // luFactor's candidate is the row at position k of its order (the pivot row here is perm[k])
    const mine = perm[k] as number;
    const cand = order[k] as number;
    let candValue = cand === mine ? Math.abs(piv) : 0;
    if (cand !== mine) {
      for (let t = r0; t < r1; t++) if (perm[lRow[t] as number] === cand) candValue = Math.abs(v[lPos[t] as number] as number);
    }
    // the largest entry of the column, the first in luFactor's order on a tie; NaN anywhere sends it dense
    let max = candValue;
    let p = k;
    let nan = Number.isNaN(candValue);
    for (let t = r0 - 1; t < r1; t++) {
      const row = t < r0 ? mine : (perm[lRow[t] as number] as number);
      if (row === cand) continue;
      const a = t < r0 ? Math.abs(piv) : Math.abs(v[lPos[t] as number] as number);
      if (Number.isNaN(a)) nan = true;
      const pos = where[row] as number;
      if (a > max || (a === max && a > 0 && pos < p)) {
        max = a;
        p = pos;
      }
    }
    if (nan || !(max > 1e-14 * (scale[k] as number)) || max === 0) return false;
    if (p !== k && candValue >= KEEP_DIAGONAL * max) p = k;
    if (order[p] !== mine) return false;
    if (p !== k) {
      order[p] = cand;
      where[cand] = p;
      order[k] = mine;
      where[mine] = k;
    }
    tp = eliminateColumn(v, lu, k, piv, tp);
  }
  for (let k = 0; k < n; k++) r.b[k] = b[perm[k] as number] as number;
  luProgramSolve(v, lu, r.b, x);
  return true;
}
