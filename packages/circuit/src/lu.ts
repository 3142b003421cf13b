/**
 * Dense LU factorisation with partial pivoting on a row-major Float64Array (Golub & Van Loan, Matrix
 * Computations, 4th ed., Algorithm 3.4.1, "Gaussian elimination with partial pivoting"), in place.
 * The benchmark compares this with mathjs `lusolve` on the matrices of the Newton loop; this one is kept
 * because it is more than an order of magnitude faster there and allocates nothing (see bench/circuit.bench.ts).
 */
export interface LuWorkspace {
  n: number;
  /** Row stride of the matrix (may exceed n, e.g. a spare row/column for the reference node). */
  stride: number;
  perm: Int32Array;
  colScale: Float64Array;
  /** Scratch: column indices of the non-zeros right of the pivot in the pivot row. */
  cols: Int32Array;
}

export function luWorkspace(n: number, stride = n): LuWorkspace {
  return { n, stride, perm: new Int32Array(n), colScale: new Float64Array(n), cols: new Int32Array(n) };
}

/**
 * Factors A (n×n in a row-major array with row stride `ws.stride`) in place.
 * Returns -1 on success or the index of the first column found singular.
 */
export function luFactor(a: Float64Array, ws: LuWorkspace): number {
  const { n, stride: s, perm, colScale, cols } = ws;
  colScale.fill(0);
  for (let i = 0; i < n; i++) {
    const row = i * s;
    for (let j = 0; j < n; j++) {
      const v = Math.abs(a[row + j] as number);
      if (v > (colScale[j] as number)) colScale[j] = v;
    }
  }
  for (let i = 0; i < n; i++) perm[i] = i;
  for (let k = 0; k < n; k++) {
    // pivot search
    let p = k;
    let max = Math.abs(a[k * s + k] as number);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(a[i * s + k] as number);
      if (v > max) {
        max = v;
        p = i;
      }
    }
    if (!(max > 1e-14 * (colScale[k] as number)) || max === 0) return k;
    // threshold pivoting (as sparse SPICE solvers do): keep the diagonal when it is within 1e-3 of the largest
    // candidate, so the fill-reducing ordering chosen before factorisation survives.
    if (p !== k && Math.abs(a[k * s + k] as number) >= 1e-3 * max) p = k;
    if (p !== k) {
      const rk = k * s;
      const rp = p * s;
      for (let j = 0; j < n; j++) {
        const t = a[rk + j] as number;
        a[rk + j] = a[rp + j] as number;
        a[rp + j] = t;
      }
      const t = perm[k] as number;
      perm[k] = perm[p] as number;
      perm[p] = t;
    }
    const rk = k * s;
    const inv = 1 / (a[rk + k] as number);
    // MNA matrices are sparse: update only the non-zero columns of the pivot row, only in rows with a non-zero
    // below the pivot (the row update is then proportional to the non-zeros, not to n).
    let nc = 0;
    for (let j = k + 1; j < n; j++) if (a[rk + j] !== 0) cols[nc++] = j;
    for (let i = k + 1; i < n; i++) {
      const ri = i * s;
      const f = a[ri + k] as number;
      if (f === 0) continue;
      const m = f * inv;
      a[ri + k] = m;
      for (let t = 0; t < nc; t++) {
        const j = cols[t] as number;
        a[ri + j] = (a[ri + j] as number) - m * (a[rk + j] as number);
      }
    }
  }
  return -1;
}

/** Solves LUx = Pb after luFactor; `b` is read and the solution is written to `x` (may not alias b). */
export function luSolve(a: Float64Array, ws: LuWorkspace, b: Float64Array, x: Float64Array): void {
  const { n, stride: s, perm } = ws;
  for (let i = 0; i < n; i++) {
    let sum = b[perm[i] as number] as number;
    const ri = i * s;
    for (let j = 0; j < i; j++) sum -= (a[ri + j] as number) * (x[j] as number);
    x[i] = sum;
  }
  for (let i = n - 1; i >= 0; i--) {
    const ri = i * s;
    let sum = x[i] as number;
    for (let j = i + 1; j < n; j++) sum -= (a[ri + j] as number) * (x[j] as number);
    x[i] = sum / (a[ri + i] as number);
  }
}

/**
 * Minimum-degree ordering of a symmetric sparsity pattern (Tinney & Walker 1967, "scheme 2"; the idea behind the
 * orderings SPICE's sparse solver uses). `adj[i]` lists the neighbours of unknown i; `adj` is consumed.
 * Returns order[newIndex] = old.
 */
export function minimumDegreeOrder(n: number, adj: Set<number>[], after?: (readonly number[] | undefined)[]): Int32Array {
  const order = new Int32Array(n);
  const done = new Uint8Array(n);
  for (let step = 0; step < n; step++) {
    let best = -1;
    let bestDeg = Infinity;
    for (let pass = 0; pass < 2 && best < 0; pass++) {
      for (let i = 0; i < n; i++) {
        if (done[i]) continue;
        // `after[i]`: i (a voltage-source branch, zero diagonal) waits until one of these nodes is eliminated,
        // which gives it a non-zero diagonal by fill-in (second pass: no constraint, only if nothing is eligible).
        const need = after?.[i];
        if (pass === 0 && need && need.length > 0 && !need.some((j) => done[j])) continue;
        const d = (adj[i] as Set<number>).size;
        if (d < bestDeg) {
          bestDeg = d;
          best = i;
        }
      }
    }
    order[step] = best;
    done[best] = 1;
    const nb = [...(adj[best] as Set<number>)];
    for (const u of nb) (adj[u] as Set<number>).delete(best);
    for (let x = 0; x < nb.length; x++) {
      const sx = adj[nb[x] as number] as Set<number>;
      for (let y = x + 1; y < nb.length; y++) {
        sx.add(nb[y] as number);
        (adj[nb[y] as number] as Set<number>).add(nb[x] as number);
      }
    }
  }
  return order;
}

/**
 * Sparse LU "compiled" for one structure: diagonal pivots in a fixed (fill-reducing) order over a compressed value
 * array. Every entry of the filled pattern has a position; the elimination is stored as lists of positions, so a
 * factorisation is a run over integer arrays with no searching (the approach of SPICE's sparse solvers, which
 * reuse the pivot order found once; Kundert, "Sparse Matrix Techniques", in Circuit Analysis, Simulation and
 * Design, 1986). Position `nnz` is a spare slot that stamps into the reference row or column write to.
 */
export interface LuProgram {
  n: number;
  nnz: number;
  /** Position of the diagonal entry of pivot k. */
  diag: Int32Array;
  /** Below pivot k: rows lRow[lStart[k] .. lStart[k+1]) with the positions lPos of (row, k). */
  lStart: Int32Array;
  lRow: Int32Array;
  lPos: Int32Array;
  /** Right of pivot k: columns uCol[uStart[k] .. uStart[k+1]) with the positions uPos of (k, col). */
  uStart: Int32Array;
  uCol: Int32Array;
  uPos: Int32Array;
  /** For pivot k, row after row of L(k), the positions of (row, col) for every col of U(k). */
  target: Int32Array;
  /** Row and column of every position (dense fall-back, column scales). */
  posRow: Int32Array;
  posCol: Int32Array;
  /** Scratch: largest magnitude per column. */
  colScale: Float64Array;
}

/**
 * Builds the program from a structural pattern `nz` (n×n, row-major, 1 = non-zero; diagonals are added).
 * Returns it with `posOf` (n×n: position of (i, j), -1 where the filled pattern is zero).
 */
export function luProgram(n: number, nz: Uint8Array): { program: LuProgram; posOf: Int32Array } {
  const p = nz.slice();
  for (let i = 0; i < n; i++) p[i * n + i] = 1;
  const rowsL: number[][] = [];
  const colsL: number[][] = [];
  for (let k = 0; k < n; k++) {
    const r: number[] = [];
    const c: number[] = [];
    for (let i = k + 1; i < n; i++) if (p[i * n + k]) r.push(i);
    for (let j = k + 1; j < n; j++) if (p[k * n + j]) c.push(j);
    for (const i of r) for (const j of c) p[i * n + j] = 1;
    rowsL.push(r);
    colsL.push(c);
  }
  const posOf = new Int32Array(n * n).fill(-1);
  const posRow: number[] = [];
  const posCol: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (!p[i * n + j]) continue;
      posOf[i * n + j] = posRow.length;
      posRow.push(i);
      posCol.push(j);
    }
  }
  const at = (i: number, j: number) => posOf[i * n + j] as number;
  const lStart = new Int32Array(n + 1);
  const uStart = new Int32Array(n + 1);
  const lRow: number[] = [];
  const lPos: number[] = [];
  const uCol: number[] = [];
  const uPos: number[] = [];
  const target: number[] = [];
  const diag = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    diag[k] = at(k, k);
    const r = rowsL[k] as number[];
    const c = colsL[k] as number[];
    for (const i of r) {
      lRow.push(i);
      lPos.push(at(i, k));
      for (const j of c) target.push(at(i, j));
    }
    for (const j of c) {
      uCol.push(j);
      uPos.push(at(k, j));
    }
    lStart[k + 1] = lRow.length;
    uStart[k + 1] = uCol.length;
  }
  const program: LuProgram = {
    n,
    nnz: posRow.length,
    diag,
    lStart,
    lRow: Int32Array.from(lRow),
    lPos: Int32Array.from(lPos),
    uStart,
    uCol: Int32Array.from(uCol),
    uPos: Int32Array.from(uPos),
    target: Int32Array.from(target),
    posRow: Int32Array.from(posRow),
    posCol: Int32Array.from(posCol),
    colScale: new Float64Array(n),
  };
  return { program, posOf };
}

/** Relative pivot threshold of the sparse path; a weaker diagonal sends the factorisation to the dense path. */
const SPARSE_PIVOT_THRESHOLD = 1e-6;

/** Largest magnitude per column of the compressed values `v` (the scale of luProgramFactor's singularity test). */
export function luColumnScale(v: Float64Array, lp: LuProgram, out: Float64Array): void {
  const { nnz, posCol } = lp;
  out.fill(0);
  for (let t = 0; t < nnz; t++) {
    const c = posCol[t] as number;
    const a = Math.abs(v[t] as number);
    if (a > (out[c] as number)) out[c] = a;
  }
}

/**
 * Factors the compressed values `v` in place along the program. Returns false (v partly modified) when a diagonal
 * pivot is too small relative to its column; the caller then factors a copy densely with luFactor. `colScale` is
 * the column scale of the matrix as assembled (luColumnScale, or an upper bound of it).
 *
 * The threshold against the column bounds the growth of the entries a pivot row adds to the rows below it (Duff,
 * Erisman & Reid, "Direct Methods for Sparse Matrices", §5.4). A pivot row with nothing right of its pivot adds
 * nothing, so no threshold applies to it: a voltage-source branch equation `v(a) = V` twinned with node a keeps its
 * exact 1 beside a forward diode's 1e100 S in the same column (ngspice solves such a deck; a column-relative test
 * calls it singular). Its singularity test is then against its own row as assembled (`orig`, the values before
 * factoring), the magnitude that an exact cancellation would show against.
 */
export function luProgramFactor(v: Float64Array, lp: LuProgram, colScale?: Float64Array, orig?: Float64Array): boolean {
  const { n, diag, lStart, lPos } = lp;
  const scale = colScale ?? lp.colScale;
  if (!colScale) luColumnScale(v, lp, scale);
  let tp = 0;
  for (let k = 0; k < n; k++) {
    const piv = v[diag[k] as number] as number;
    const ap = Math.abs(piv);
    if (!(ap > 1e-14 * (scale[k] as number))) {
      if (!orig || !emptyRight(v, lp, k) || !(ap > 1e-14 * rowScale(orig, lp, k))) return false;
    } else if (!emptyRight(v, lp, k)) {
      const weak = ap / SPARSE_PIVOT_THRESHOLD;
      // The column's entries below the pivot are not changed by its own elimination, so they are checked first.
      for (let t = lStart[k] as number; t < (lStart[k + 1] as number); t++) if (Math.abs(v[lPos[t] as number] as number) > weak) return false;
    }
    tp = eliminateColumn(v, lp, k, piv, tp);
  }
  return true;
}

/** Row k holds no non-zero right of its pivot (structurally or by value). */
function emptyRight(v: Float64Array, lp: LuProgram, k: number): boolean {
  const { uStart, uPos } = lp;
  for (let u = uStart[k] as number; u < (uStart[k + 1] as number); u++) if (v[uPos[u] as number] !== 0) return false;
  return true;
}

/** Largest magnitude in row k of `a` (positions are numbered row after row, so the row is one run of posRow). */
function rowScale(a: Float64Array, lp: LuProgram, k: number): number {
  const { posRow, nnz } = lp;
  let lo = 0;
  let hi = nnz;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((posRow[mid] as number) < k) lo = mid + 1;
    else hi = mid;
  }
  let m = 0;
  for (let t = lo; t < nnz && posRow[t] === k; t++) m = Math.max(m, Math.abs(a[t] as number));
  return m;
}

/**
 * One step of the compiled elimination: the multipliers of column k (stored in place) and the update of the rows
 * below it. `tp` is the position in the program's target list where column k's updates start; the next column's is
 * returned. The sparse factorisation and the second-order replay (`repivot.ts`) both run exactly this arithmetic.
 */
export function eliminateColumn(v: Float64Array, lp: LuProgram, k: number, piv: number, tp: number): number {
  const { lStart, lPos, uStart, uPos, target } = lp;
  const r0 = lStart[k] as number;
  const r1 = lStart[k + 1] as number;
  const inv = 1 / piv;
  const c0 = uStart[k] as number;
  const nc = (uStart[k + 1] as number) - c0;
  for (let t = r0; t < r1; t++) {
    const li = lPos[t] as number;
    const f = v[li] as number;
    if (f === 0) {
      tp += nc;
      continue;
    }
    const m = f * inv;
    v[li] = m;
    for (let u = 0; u < nc; u++) {
      const ti = target[tp + u] as number;
      v[ti] = (v[ti] as number) - m * (v[uPos[c0 + u] as number] as number);
    }
    tp += nc;
  }
  return tp;
}

/** Solves after luProgramFactor: x = A⁻¹ b for the first n entries (x may not alias b). */
export function luProgramSolve(v: Float64Array, lp: LuProgram, b: Float64Array, x: Float64Array): void {
  const { n, diag, lStart, lRow, lPos, uStart, uCol, uPos } = lp;
  for (let i = 0; i < n; i++) x[i] = b[i] as number;
  for (let k = 0; k < n; k++) {
    const yk = x[k] as number;
    if (yk === 0) continue;
    const r1 = lStart[k + 1] as number;
    for (let t = lStart[k] as number; t < r1; t++) {
      const i = lRow[t] as number;
      x[i] = (x[i] as number) - (v[lPos[t] as number] as number) * yk;
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    let sum = x[k] as number;
    const c1 = uStart[k + 1] as number;
    for (let u = uStart[k] as number; u < c1; u++) sum -= (v[uPos[u] as number] as number) * (x[uCol[u] as number] as number);
    x[k] = sum / (v[diag[k] as number] as number);
  }
}

/** Scatters compressed values into a dense n×n row-major matrix (for the pivoting fall-back and the benchmark). */
export function luProgramToDense(v: Float64Array, lp: LuProgram, out: Float64Array): void {
  const { n, nnz, posRow, posCol } = lp;
  out.fill(0);
  for (let t = 0; t < nnz; t++) out[(posRow[t] as number) * n + (posCol[t] as number)] = v[t] as number;
}
