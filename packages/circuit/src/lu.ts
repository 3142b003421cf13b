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
 * orderings SPICE's sparse solver uses). `adj[i]` lists the neighbours of unknown i. Returns order[newIndex] = old.
 */
export function minimumDegreeOrder(n: number, adj: Set<number>[]): Int32Array {
  const order = new Int32Array(n);
  const done = new Uint8Array(n);
  for (let step = 0; step < n; step++) {
    let best = -1;
    let bestDeg = Infinity;
    for (let i = 0; i < n; i++) {
      if (done[i]) continue;
      const d = (adj[i] as Set<number>).size;
      if (d < bestDeg) {
        bestDeg = d;
        best = i;
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
