import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { flatten, parseNetlist, solveOp } from './index';
import { luColumnScale, luFactor, luProgram, luSolve, luWorkspace } from './lu';
import { repivot, repivotSolve } from './repivot';
import { clearTopologyCache, topologyOf } from './structure-cache';

/** Random sparse systems with weak diagonals, so dense pivoting swaps rows. */
function system(n: number, seed: number) {
  let s = seed + 1;
  const rand = () => (s = (s * 16807) % 2147483647) / 2147483647;
  const nz = new Uint8Array(n * n);
  const dense = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i === j || rand() < 0.35) {
        nz[i * n + j] = 1;
        dense[i * n + j] = i === j && rand() < 0.5 ? (rand() - 0.5) * 1e-8 : rand() * 2 - 1;
      }
    }
  }
  const { program, posOf } = luProgram(n, nz);
  const values = new Float64Array(program.nnz + 1);
  for (let t = 0; t < n * n; t++) if ((posOf[t] as number) >= 0) values[posOf[t] as number] = dense[t] as number;
  return { program, values, dense, b: Float64Array.from({ length: n }, () => rand() * 10 - 5), rand };
}

describe('second pivot order', () => {
  it('gives the dense fall-back’s digits exactly, or declines when dense pivoting would choose other rows', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 12 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
        const { program, values, dense, b, rand } = system(n, seed);
        const ws = luWorkspace(n);
        const first = dense.slice();
        if (luFactor(first, ws) >= 0) return;
        const r = repivot(program, ws.perm);
        // a later matrix of the same structure: some entries moved by up to a factor of 10
        const later = values.slice();
        for (let t = 0; t < program.nnz; t++) if (rand() < 0.3) later[t] = (later[t] as number) * (0.1 + rand() * 9.9);
        for (const v of [values, later]) {
          const scale = new Float64Array(n);
          luColumnScale(v, program, scale);
          const x = new Float64Array(n);
          const used = repivotSolve(r, v, scale, b, x);
          const a = new Float64Array(n * n);
          for (let t = 0; t < program.nnz; t++) a[(program.posRow[t] as number) * n + (program.posCol[t] as number)] = v[t] as number;
          const ws2 = luWorkspace(n);
          const sing = luFactor(a, ws2);
          if (v === values) expect(used).toBe(true);
          if (!used) continue;
          expect(sing).toBe(-1);
          expect([...ws2.perm]).toEqual([...r.perm]);
          const ref = new Float64Array(n);
          luSolve(a, ws2, b, ref);
          for (let i = 0; i < n; i++) expect(x[i]).toBe(ref[i]);
        }
      }),
      { numRuns: 300, seed: 11 },
    );
  });

  it('keeps an opto LED that is off on the sparse path after its first dense factorisation, with the same digits', () => {
    // the LED's anode node is held only by the junction's pA-level conductance beside the ±1 of the sense source
    const c = flatten(parseNetlist('led off\n.model DLED D(is=1e-20 n=1.8)\nV1 vcc 0 1\nR1 vcc a 2.2k\nR3 a 0 10k\nVS a ai 0\nDL ai k DLED\nR2 k 0 1k\n'));
    clearTopologyCache();
    const first = solveOp(c);
    const work = topologyOf(c, []).work;
    expect(work.denseFallbacks).toBe(1);
    expect(work.repivot).toBeDefined();
    const again = solveOp(c);
    expect(work.denseFallbacks).toBe(1);
    for (const [node, v] of Object.entries(first.nodes)) expect(again.nodes[node]).toBe(v);
    expect(first.nodes.a).toBeCloseTo((1 * 10e3) / 12.2e3, 6);
  });
});
