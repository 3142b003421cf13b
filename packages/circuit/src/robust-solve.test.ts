/**
 * Decks of the robustness corpus (bench/corpus.ts, seed 15) that once failed here while ngspice 39 solved them, with
 * ngspice's answers (`ngspice -b`, `.options reltol=1e-6 vntol=1e-9 abstol=1e-15`) as the expected values, compared
 * within max(1 mV, 0.1 %) (the acceptance of the corpus, bench/robustness.ts).
 */
import { describe, expect, it } from 'vitest';
import { flatten, parseNetlist, solveOp } from './index';
import { luProgram, luProgramFactor, luProgramSolve } from './lu';

const tolerance = (v: number) => Math.max(1e-3, 1e-3 * Math.abs(v));

function expectNear(nodes: Record<string, number>, ref: Record<string, number>): void {
  for (const [node, v] of Object.entries(ref)) expect(Math.abs((nodes[node] as number) - v), node).toBeLessThanOrEqual(tolerance(v));
}

describe('convergence where ngspice converges', () => {
  it('a diode forced to 12 V by a source: ngspice 39 reports 8.49e101 A and solves the rest (b = 9.000002 V)', () => {
    // the diode's conductance (~1e103 S) stands in the same column as the source's exact 1; the source's branch
    // equation has nothing right of its pivot, so it needs no threshold against that column (lu.ts)
    const deck = ['diode forced by a source', '.model DM D(IS=2.903e-9 N=1.824)', 'V1 a 0 12', 'D1 a 0 DM', 'R1 a b 1k', 'R2 b 0 3k', 'D2 b a DM'];
    const r = solveOp(flatten(parseNetlist(deck.join('\n'))));
    expect(r.converged, r.message).toBe(true);
    expectNear(r.nodes, { a: 12, b: 9.000002 });
    // the same diode in ngspice's print of corpus deck mesh-252-powered: v1#branch = -8.49382e+101
    expect((r.sources.v1 as number) / -8.49382e101).toBeCloseTo(1, 4);
  });

  it('a bridge rectifier, unpowered and lifted, probed by an ohmmeter: every junction reverse biased, picoamperes (corpus bridge-251)', () => {
    // node l sits between two reverse-biased diodes with 18 mΩ series resistance: 57 S inside, picosiemens outside;
    // the Newton iterates only settle with an accurately computed refinement residual (newton.ts, Dot2)
    const deck = [
      'bridge-251-unpowered-lifted (seed 15)',
      '.model DR D(IS=1.005e-12 N=1.188 RS=0.01759)',
      '.model DZ D(IS=1e-14 N=1 BV=15.6 IBV=1m)',
      '.model QN NPN(IS=7.869e-16 BF=224.2 BR=3.815 VAR=35.12 IKR=0.08092 ISE=1.136e-13 NE=1.857 IRB=0.0002961 RC=0.1337 RE=0.01901)',
      'D1 l busp DR',
      'D2 n busp DR',
      'D3 0 l DR',
      'D4 0 n DR',
      'RZ busp zb 1.745e+4',
      'DZ1 0 zb DZ',
      'QREG busp zb v15 QN',
      'RL15 v15 0 2780',
      'VMETER msrc n 0.5',
      'RMETER msrc busp 1000',
      '.op',
      '.end',
    ];
    const r = solveOp(flatten(parseNetlist(deck.join('\n'))));
    expect(r.converged, r.message).toBe(true);
    expectNear(r.nodes, { busp: 0.3236851, l: 0.1621961, msrc: 0.3236854, n: -0.176315, v15: 8.60012e-7, zb: 0.3236834 });
  });
});

describe('sparse LU pivots', () => {
  it('accepts a pivot far below its column when its row has nothing right of it (no growth: Duff, Erisman & Reid §5.4)', () => {
    // rows: v = 12 (the branch equation), 1e103·v + i = 1e104 (the node); columns v, i
    const nz = Uint8Array.from([1, 0, 1, 1]);
    const { program, posOf } = luProgram(2, nz);
    const fill = () => {
      const v = new Float64Array(program.nnz + 1);
      [1, 0, 1e103, 1].forEach((x, t) => {
        if ((posOf[t] as number) >= 0) v[posOf[t] as number] = x;
      });
      return v;
    };
    const orig = fill();
    expect(luProgramFactor(fill(), program)).toBe(false);
    const v = fill();
    expect(luProgramFactor(v, program, undefined, orig)).toBe(true);
    const x = new Float64Array(2);
    luProgramSolve(v, program, Float64Array.from([12, 1e104]), x);
    expect(x[0]).toBe(12);
    expect((x[1] as number) / -2e103).toBeCloseTo(1, 12);
  });
});
