import { describe, expect, it } from 'vitest';
import { cloneCircuit, flatten, GMIN, parseNetlist, resistor, solveOp, VT, withoutParts, type Circuit } from './index';

const op = (text: string) => {
  const r = solveOp(flatten(parseNetlist(text)));
  expect(r.converged, r.message).toBe(true);
  return r;
};

describe('linear MNA', () => {
  it('Alexander & Sadiku, Fundamentals of Electric Circuits, Example 3.1: v1 = 13.333 V, v2 = 20 V', () => {
    // 2 Ω n1–0, 4 Ω n1–n2, 6 Ω n2–0; net 5 A injected into n1 and 5 A into n2.
    const r = op('example 3.1\nI1 0 n1 5\nI2 0 n2 5\nR1 n1 0 2\nR2 n1 n2 4\nR3 n2 0 6\n');
    expect(r.nodes.n1).toBeCloseTo(40 / 3, 9);
    expect(r.nodes.n2).toBeCloseTo(20, 9);
    expect(r.method).toBe('linear');
  });

  it('two sources: vb = 6.000 V, I(V1) = -4 mA, I(V2) = +1 mA (hand nodal analysis; ngspice 39 prints the same, see ngspice/expected.json)', () => {
    const r = op('t\nV1 a 0 10\nV2 c 0 5\nR1 a b 1k\nR2 b 0 2k\nR3 b c 1k\n');
    expect(r.nodes.b).toBeCloseTo(6, 12);
    expect(r.sources.v1).toBeCloseTo(-4e-3, 15);
    expect(r.sources.v2).toBeCloseTo(1e-3, 15);
    expect(r.currents.R1).toBeCloseTo(4e-3, 15);
    expect(r.currents.R3).toBeCloseTo(1e-3, 15);
  });

  it('voltage divider: Vout = Vin·R2/(R1+R2) (Alexander & Sadiku §2.7, voltage division)', () => {
    const r = op('t\nV1 in 0 15\nR1 in out 10k\nR2 out 0 4.7k\n');
    expect(r.nodes.out).toBeCloseTo((15 * 4.7) / 14.7, 12);
  });

  it('Wheatstone bridge: balanced gives 0 V across the detector; unbalanced detector current = Vth/(Rth+Rg) (Alexander & Sadiku §4.5 Thevenin, §2.8 Wheatstone bridge)', () => {
    const bal = op('t\nV1 s 0 10\nR1 s a 1k\nR2 a 0 2k\nR3 s b 1.5k\nR4 b 0 3k\nRG a b 500\n');
    expect(Math.abs((bal.nodes.a as number) - (bal.nodes.b as number))).toBeLessThan(1e-12);
    expect(bal.nodes.a).toBeCloseTo(20 / 3, 12);
    const r = op('t\nV1 s 0 10\nR1 s a 1k\nR2 a 0 2k\nR3 s b 1.5k\nR4 b 0 2k\nRG a b 500\n');
    const vth = 10 * (2 / 3 - 2 / 3.5);
    const rth = (1e3 * 2e3) / 3e3 + (1.5e3 * 2e3) / 3.5e3;
    expect(r.currents.RG).toBeCloseTo(vth / (rth + 500), 14);
  });

  it('E, F, G, H sources (SPICE3 user manual §3.2.3–3.2.6 definitions; hand calculation)', () => {
    const r = op(
      't\nV1 a 0 2\nR1 a 0 1k\nVS a s 0\nRS s 0 2k\nE1 e 0 a 0 3\nRE e 0 10k\nG1 0 g a 0 1m\nRG g 0 1k\nF1 0 f VS 4\nRF f 0 500\nH1 h 0 VS 2k\nRH h 0 1k\n',
    );
    expect(r.nodes.e).toBeCloseTo(6, 12); // 3 × 2 V
    expect(r.nodes.g).toBeCloseTo(2, 12); // 1 mS × 2 V into 1 kΩ
    expect(r.nodes.f).toBeCloseTo(2, 12); // 4 × 1 mA into 500 Ω
    expect(r.nodes.h).toBeCloseTo(2, 12); // 2 kΩ × 1 mA
    expect(r.sources.vs).toBeCloseTo(1e-3, 15);
    expect(r.currents.F1).toBeCloseTo(4e-3, 15);
    expect(r.currents.G1).toBeCloseTo(2e-3, 15);
  });

  it('inductors are shorts and capacitors open at DC (SPICE DC operating point convention)', () => {
    const r = op('t\nV1 a 0 5\nL1 a b 10m\nR1 b 0 1k\nC1 b 0 1u\n');
    expect(r.nodes.b).toBeCloseTo(5, 12);
    expect(r.sources.l1).toBeCloseTo(5e-3, 15);
    expect(r.currents.C1).toBe(0);
  });

  it('nested subcircuit with parameters: internal node named instance.node (hand series/parallel reduction)', () => {
    const r = op(
      't\n.param RTOP=10k\n.subckt half in out params: R=1k\nR1 in out {R}\nR2 out 0 {2*R}\n.ends\n.subckt stage in out\nX1 in mid half params: R={RTOP/10}\nX2 mid out half R=2.2k\n.ends\nV1 vin 0 9\nXA vin o stage\nRLOAD o 0 33k\n',
    );
    // X2 + RLOAD: 2.2k + (4.4k ∥ 33k) from mid; mid node also has 2k to ground; X1 top 1k.
    const lower = 2.2e3 + (4.4e3 * 33e3) / 37.4e3;
    const mid = (2e3 * lower) / (2e3 + lower);
    const vmid = (9 * mid) / (1e3 + mid);
    expect(r.nodes['xa.mid']).toBeCloseTo(vmid, 10);
    const lowPar = (4.4e3 * 33e3) / 37.4e3;
    expect(r.nodes.o).toBeCloseTo((vmid * lowPar) / (2.2e3 + lowPar), 10);
  });
});

describe('nonlinear devices', () => {
  it('diode on a voltage source follows Shockley: I = IS(exp(V/(N·VT)) − 1) + GMIN·V (Sedra & Smith, Microelectronic Circuits, diode equation; SPICE GMIN)', () => {
    const r = op('t\nV1 a 0 0.65\nD1 a 0 dm\n.model dm D(IS=1e-14 N=1.1)\n');
    const expected = 1e-14 * (Math.exp(0.65 / (1.1 * VT)) - 1) + GMIN * 0.65;
    expect(r.currents.D1).toBeCloseTo(expected, 15);
    expect(Math.abs((r.sources.v1 as number) + expected) / expected).toBeLessThan(1e-6);
  });

  it('diode RS adds an internal node with the IR drop', () => {
    const r = op('t\nV1 in 0 5\nR1 in a 1k\nD1 a 0 dm\n.model dm D(IS=1e-14 RS=10)\n');
    const i = r.currents.D1 as number;
    expect((r.nodes.a as number) - (r.nodes['d1#int'] as number)).toBeCloseTo(10 * i, 9);
  });

  it('BJT forward active on fixed junction voltages matches the Ebers–Moll transport equations (Ebers & Moll 1954; Gummel & Poon 1970 at default parameters)', () => {
    const r = op('t\nVB b 0 0.7\nVC c 0 5\nQ1 c b 0 qn\n.model qn NPN(IS=1e-15 BF=120 BR=3)\n');
    const cbe = 1e-15 * (Math.exp(0.7 / VT) - 1);
    const cbc = 1e-15 * (Math.exp(-4.3 / VT) - 1);
    const ic = cbe - cbc - cbc / 3 - GMIN * -4.3;
    const ib = cbe / 120 + GMIN * 0.7 + cbc / 3 + GMIN * -4.3;
    expect(Math.abs((r.currents.Q1 as number) - ic) / ic).toBeLessThan(1e-9);
    expect(Math.abs((r.currents['Q1:b'] as number) - ib) / ib).toBeLessThan(1e-9);
    expect(r.currents['Q1:e']).toBeCloseTo(-(ic + ib), 15);
  });

  it('PNP is the mirror image of the NPN (Ebers–Moll with reversed polarities)', () => {
    const n = op('t\nVB b 0 0.68\nVC c 0 3\nQ1 c b 0 q\n.model q NPN(IS=2e-15 BF=90)\n');
    const p = op('t\nVB b 0 -0.68\nVC c 0 -3\nQ1 c b 0 q\n.model q PNP(IS=2e-15 BF=90)\n');
    expect(p.currents.Q1).toBeCloseTo(-(n.currents.Q1 as number), 15);
  });

  it('warm start from a previous solution converges in fewer iterations to the same point', () => {
    const c = flatten(
      parseNetlist('t\nV1 in 0 12\nR1 in a 4.7k\nD1 a b dm\nD2 b 0 dm\nQ1 in a e qn\nRE e 0 1k\n.model dm D(IS=4e-9 N=1.9)\n.model qn NPN(IS=1e-14 BF=200)\n'),
    );
    const cold = solveOp(c);
    const warm = solveOp(c, { initialGuess: cold.x });
    expect(warm.converged).toBe(true);
    expect(warm.iterations).toBeLessThan(cold.iterations);
    expect(warm.nodes.e).toBeCloseTo(cold.nodes.e as number, 8);
    const byName = solveOp(c, { initialGuess: cold.nodes });
    expect(byName.nodes.e).toBeCloseTo(cold.nodes.e as number, 8);
  });
});

describe('islands, singular circuits and non-convergence', () => {
  it('an island left by a derived state solves and does not disturb the rest (tiny conductance to the reference)', () => {
    const c = flatten(parseNetlist('t\nV1 a 0 10\nR1 a b 1k\nR2 b 0 1k\nR3 b c 1k\nR4 c d 1k\nR5 d 0 1k\n'));
    const lifted = withoutParts(c, ['R5', 'R3']);
    const r = solveOp(lifted);
    expect(r.converged).toBe(true);
    expect(r.nodes.b).toBeCloseTo(5, 9);
    expect(Math.abs(r.nodes.c as number)).toBeLessThan(1e-6);
  });

  it('a loop of voltage sources is reported, not a crash', () => {
    const r = solveOp(flatten(parseNetlist('t\nV1 a 0 5\nV2 a 0 3\nR1 a 0 1k\n')));
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/singular matrix at the branch of v\d \(a loop of voltage sources/);
  });

  it('non-convergence is reported with converged:false and a message', () => {
    const c = flatten(parseNetlist('t\nV1 in 0 50\nR1 in a 1\nD1 a b dm\nD2 b 0 dm\n.model dm D(IS=1e-16)\n'));
    const r = solveOp(c, { maxIterations: 1 });
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/no convergence/);
  });

  it('the cached ordering of a topology is value-independent: zero gains, then non-zero gains, solve correctly (hand calculation)', () => {
    const deck = (g: number) => `t\nV1 a 0 2\nR1 a 0 1k\nE1 e 0 a 0 ${g}\nRE e 0 10k\nG1 0 g a 0 ${g / 1000}\nRG g 0 1k\n`;
    expect(solveOp(flatten(parseNetlist(deck(0)))).nodes.e).toBe(0);
    const r = solveOp(flatten(parseNetlist(deck(3))));
    expect(r.nodes.e).toBeCloseTo(6, 12);
    expect(r.nodes.g).toBeCloseTo(6, 12);
  });

  it('copies of a circuit can be edited (a fault) without touching the original', () => {
    const c = flatten(parseNetlist('t\nV1 a 0 10\nR1 a b 1k\nR2 b 0 1k\n'));
    const f: Circuit = cloneCircuit(c);
    f.elements = f.elements.map((e) => (e.name === 'R2' ? resistor('R2', 'b', '0', 0.01) : e));
    expect(solveOp(f).nodes.b).toBeCloseTo((10 * 0.01) / 1000.01, 12);
    expect(solveOp(c).nodes.b).toBeCloseTo(5, 12);
  });
});
