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
}

export function luWorkspace(n: number, stride = n): LuWorkspace {
  return { n, stride, perm: new Int32Array(n), colScale: new Float64Array(n) };
}

/**
 * Factors A (n×n in a row-major array with row stride `ws.stride`) in place.
 * Returns -1 on success or the index of the first column found singular.
 */
export function luFactor(a: Float64Array, ws: LuWorkspace): number {
  const { n, stride: s, perm, colScale } = ws;
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
    for (let i = k + 1; i < n; i++) {
      const ri = i * s;
      const f = a[ri + k] as number;
      if (f === 0) continue; // MNA matrices are sparse: skip rows with nothing to eliminate
      const m = f * inv;
      a[ri + k] = m;
      for (let j = k + 1; j < n; j++) {
        const u = a[rk + j] as number;
        if (u !== 0) a[ri + j] = (a[ri + j] as number) - m * u;
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
