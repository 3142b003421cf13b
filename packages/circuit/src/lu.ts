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
 * Symbolic structure for sparse LU with diagonal pivots in a fixed (fill-reducing) order: for each pivot k the
 * rows below it and the columns right of it that are structurally non-zero after fill-in.
 */
export interface SparsePattern {
  n: number;
  stride: number;
  rowStart: Int32Array;
  rows: Int32Array;
  colStart: Int32Array;
  cols: Int32Array;
  /** Flat indices and columns of every structural entry (for column scales). */
  nzIndex: Int32Array;
  nzCol: Int32Array;
  colScale: Float64Array;
}

/** Builds the fill-in pattern from a structural pattern `nz` (n×n, row-major, 1 = non-zero). */
export function sparsePattern(n: number, stride: number, nz: Uint8Array): SparsePattern {
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
  const flat = (ls: number[][]) => {
    const start = new Int32Array(n + 1);
    for (let k = 0; k < n; k++) start[k + 1] = (start[k] as number) + (ls[k] as number[]).length;
    const out = new Int32Array(start[n] as number);
    ls.forEach((l, k) => out.set(l, start[k] as number));
    return { start, out };
  };
  const r = flat(rowsL);
  const c = flat(colsL);
  const idx: number[] = [];
  const col: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (p[i * n + j]) {
        idx.push(i * stride + j);
        col.push(j);
      }
    }
  }
  return {
    n,
    stride,
    rowStart: r.start,
    rows: r.out,
    colStart: c.start,
    cols: c.out,
    nzIndex: Int32Array.from(idx),
    nzCol: Int32Array.from(col),
    colScale: new Float64Array(n),
  };
}

/** Relative pivot threshold of the sparse path; a weaker diagonal sends the factorisation to the dense path. */
const SPARSE_PIVOT_THRESHOLD = 1e-6;

/**
 * Sparse LU in place with diagonal pivots along the pattern. Returns false (matrix partly modified) when a
 * diagonal pivot is too small relative to its column; the caller then re-assembles and uses luFactor.
 */
export function luSparseFactor(a: Float64Array, sp: SparsePattern): boolean {
  const { n, stride: s, rowStart, rows, colStart, cols, nzIndex, nzCol, colScale } = sp;
  colScale.fill(0);
  for (let t = 0; t < nzIndex.length; t++) {
    const c = nzCol[t] as number;
    const v = Math.abs(a[nzIndex[t] as number] as number);
    if (v > (colScale[c] as number)) colScale[c] = v;
  }
  for (let k = 0; k < n; k++) {
    const rk = k * s;
    const piv = a[rk + k] as number;
    const ap = Math.abs(piv);
    if (!(ap > 1e-14 * (colScale[k] as number))) return false;
    const r0 = rowStart[k] as number;
    const r1 = rowStart[k + 1] as number;
    for (let t = r0; t < r1; t++) if (Math.abs(a[(rows[t] as number) * s + k] as number) * SPARSE_PIVOT_THRESHOLD > ap) return false;
    const inv = 1 / piv;
    const c0 = colStart[k] as number;
    const c1 = colStart[k + 1] as number;
    for (let t = r0; t < r1; t++) {
      const ri = (rows[t] as number) * s;
      const f = a[ri + k] as number;
      if (f === 0) continue;
      const m = f * inv;
      a[ri + k] = m;
      for (let u = c0; u < c1; u++) {
        const j = cols[u] as number;
        a[ri + j] = (a[ri + j] as number) - m * (a[rk + j] as number);
      }
    }
  }
  return true;
}

/** Solves after luSparseFactor: x = A⁻¹ b (x may not alias b). */
export function luSparseSolve(a: Float64Array, sp: SparsePattern, b: Float64Array, x: Float64Array): void {
  const { n, stride: s, rowStart, rows, colStart, cols } = sp;
  for (let i = 0; i < n; i++) x[i] = b[i] as number;
  for (let k = 0; k < n; k++) {
    const yk = x[k] as number;
    if (yk === 0) continue;
    const r1 = rowStart[k + 1] as number;
    for (let t = rowStart[k] as number; t < r1; t++) {
      const i = rows[t] as number;
      x[i] = (x[i] as number) - (a[i * s + k] as number) * yk;
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const rk = k * s;
    let sum = x[k] as number;
    const c1 = colStart[k + 1] as number;
    for (let u = colStart[k] as number; u < c1; u++) {
      const j = cols[u] as number;
      sum -= (a[rk + j] as number) * (x[j] as number);
    }
    x[k] = sum / (a[rk + k] as number);
  }
}
