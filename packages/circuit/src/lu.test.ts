import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { luFactor, luProgram, luProgramFactor, luProgramSolve, luSolve, luWorkspace } from './lu';

describe('sparse LU program', () => {
  it('solves random diagonally dominant sparse systems like dense partial pivoting (Golub & Van Loan Alg. 3.4.1)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
        let s = seed + 1;
        const rand = () => (s = (s * 16807) % 2147483647) / 2147483647;
        const dense = new Float64Array(n * n);
        const nz = new Uint8Array(n * n);
        for (let i = 0; i < n; i++) {
          let sum = 0;
          for (let j = 0; j < n; j++) {
            if (i !== j && rand() < 0.3) {
              dense[i * n + j] = rand() * 2 - 1;
              nz[i * n + j] = 1;
              sum += Math.abs(dense[i * n + j] as number);
            }
          }
          dense[i * n + i] = sum + 0.5 + rand();
        }
        const b = Float64Array.from({ length: n }, () => rand() * 10 - 5);
        const { program, posOf } = luProgram(n, nz);
        const v = new Float64Array(program.nnz + 1);
        for (let t = 0; t < n * n; t++) if ((posOf[t] as number) >= 0) v[posOf[t] as number] = dense[t] as number;
        expect(luProgramFactor(v, program)).toBe(true);
        const x = new Float64Array(n);
        luProgramSolve(v, program, b, x);
        const ws = luWorkspace(n);
        const a = dense.slice();
        expect(luFactor(a, ws)).toBe(-1);
        const ref = new Float64Array(n);
        luSolve(a, ws, b, ref);
        for (let i = 0; i < n; i++) expect(x[i]).toBeCloseTo(ref[i] as number, 10);
      }),
      { numRuns: 200, seed: 7 },
    );
  });

  it('refuses a pivot too weak for its column so the caller can pivot densely', () => {
    // [[1e-9, 1], [1, 1]]: the diagonal 1e-9 is a million times below the 1 under it
    const nz = Uint8Array.from([1, 1, 1, 1]);
    const { program, posOf } = luProgram(2, nz);
    const v = new Float64Array(program.nnz + 1);
    [1e-9, 1, 1, 1].forEach((x, t) => (v[posOf[t] as number] = x));
    expect(luProgramFactor(v, program)).toBe(false);
  });
});
