/**
 * The accepted SPICE subset: what is implemented, ignored or refused (README "Accepted subset"), source functions at
 * .op (ngspice vsrcload.c: the DC value when given, else the function at time 0), and SolveError.
 */
import { describe, expect, it } from 'vitest';
import { flatten, measure, NetlistError, parseNetlist, read, SolveError, solveNodes, solveOp, MeasurementError } from './index';

const flat = (text: string) => flatten(parseNetlist(text));
const refusal = (text: string): string => {
  try {
    flat(text);
  } catch (err) {
    expect(err).toBeInstanceOf(NetlistError);
    return (err as Error).message;
  }
  throw new Error('accepted');
};

describe('model parameters: implemented, ignored or refused naming model, parameter and line', () => {
  it('a DC-relevant parameter outside the subset is refused (quasi-saturation, substrate current, diode IKF)', () => {
    expect(refusal('t\nV1 c 0 5\nQ1 c c 0 QX\n.model QX NPN(IS=1e-15 RCO=50)\n')).toBe(
      'line 4: .model qx: parameter RCO (quasi-saturation) changes the DC operating point and is not supported',
    );
    expect(refusal('t\nV1 c 0 5\nQ1 c c 0 QX\n.model QX NPN(ISS=1e-15)\n')).toMatch(/^line 4: \.model qx: parameter ISS/);
    expect(refusal('t\nV1 a 0 5\nD1 a 0 DX\n.model DX D(IKF=1m)\n')).toMatch(/^line 4: \.model dx: parameter IKF \(high-injection knee current\)/);
    expect(refusal('t\nV1 a 0 5\nD1 a 0 DX\n.model DX D(FOO=1)\n')).toBe('line 4: .model dx: unknown diode parameter FOO');
    expect(refusal('t\nV1 a 0 5\nD1 a 0 DX\n.model DX D(TNOM=50)\n')).toMatch(/parameter TNOM \(nominal temperature 50 °C; 27 °C is supported\)/);
  });

  it('capacitances, transit times and noise parameters are accepted and ignored (no effect at DC)', () => {
    const withCaps = flat('t\nV1 c 0 5\nR1 c b 100k\nQ1 c b 0 QX\n.model QX NPN(IS=1e-15 BF=100 CJE=2p CJC=1p TF=0.3n TR=10n KF=1e-16 AF=1 XTB=1.5 TNOM=27)\n');
    const plain = flat('t\nV1 c 0 5\nR1 c b 100k\nQ1 c b 0 QX\n.model QX NPN(IS=1e-15 BF=100)\n');
    expect(solveOp(withCaps).nodes.b).toBe(solveOp(plain).nodes.b);
  });

  it('the Early voltage changes the operating point (VAF read, not dropped)', () => {
    const deck = (va: string) => `t\nVCC vcc 0 15\nRB vcc b 680k\nRC vcc c 4.7k\nQ1 c b 0 QE\n.model QE NPN(IS=1e-15 BF=120 ${va})\n`;
    const ic = (va: string) => (15 - (solveOp(flat(deck(va))).nodes.c as number)) / 4.7e3;
    // Gummel–Poon (ngspice manual, BJT model): q1 = 1/(1 − VBC/VAF) divides the transport current, so IC rises
    // by about VCE/VAF at the same base current; a few % here (ngspice/decks/bjt-early.cir checks the values)
    const ratio = ic('VAF=45') / ic('');
    expect(ratio).toBeGreaterThan(1.02);
    expect(ratio).toBeLessThan(1.1);
  });
});

describe('commands and options', () => {
  it('analyses and outputs are ignored; circuit-changing commands are refused naming the command', () => {
    expect(() => flat('t\nV1 a 0 1\nR1 a 0 1k\n.tran 1u 1m\n.ac dec 10 1 1k\n.print tran v(a)\n.options reltol=1e-4\n.temp 27\n')).not.toThrow();
    expect(refusal('t\nV1 a 0 1\nR1 a 0 1k\n.nodeset v(a)=1\n')).toMatch(/^line 4: unsupported command "\.nodeset"/);
    expect(refusal('t\nV1 a 0 1\nR1 a 0 1k\n.temp 85\n')).toMatch(/^line 4: \.temp: temperature 85 is not supported/);
    expect(refusal('t\nV1 a 0 1\nR1 a 0 1k\n.options gmin=1e-9\n')).toMatch(/^line 4: \.options: GMIN=1e-9 is not supported/);
  });

  it('sources with SIN, PULSE, PWL, EXP, SFFM take the DC value or their time-zero value (checked with ngspice 39)', () => {
    const c = flat(
      't\nV1 a 0 SIN(0.5 2 1k 0 0 30)\nR1 a 0 1k\nV2 b 0 PULSE(1.5 5 1u 1n 1n 1u 2u)\nR2 b 0 1k\nV3 c 0 PWL(0 0.7 1m 3)\nR3 c 0 1k\n' +
        'V4 d 0 EXP(2.5 4 1u 1u 2u 1u)\nR4 d 0 1k\nV5 e 0 DC 3.3 SIN(0 1 1k)\nR5 e 0 1k\nI1 0 f SFFM(1m 2m 1k 1 10)\nR6 f 0 1k\n',
    );
    const n = solveOp(c).nodes;
    // ngspice 39 .op on the same deck (ngspice/decks/source-functions.cir): 1.5, 1.5, 0.7, 2.5, 3.3, 1.0
    expect([n.a, n.b, n.c, n.d, n.e, n.f].map((v) => Number((v as number).toFixed(9)))).toEqual([1.5, 1.5, 0.7, 2.5, 3.3, 1]);
  });
});

describe('a solve that fails is an error, never a reading', () => {
  // an invented deck no strategy can solve within one iteration per step
  const hard = 't\nV1 in 0 50\nR1 in a 1\nD1 a b dm\nD2 b 0 dm\n.model dm D(IS=1e-16)\n';

  it('solveNodes throws SolveError naming the strategies tried', () => {
    let caught: unknown;
    try {
      solveNodes(flat(hard), { maxIterations: 1 });
    } catch (err) {
      caught = err;
    }
    expect(caught).toBeInstanceOf(SolveError);
    const e = caught as SolveError;
    expect(e.name).toBe('SolveError');
    expect(e).not.toBeInstanceOf(MeasurementError);
    expect(e.message).toMatch(/^the model could not be solved in this state: no convergence after \d+ Newton iterations/);
    expect(e.strategies).toEqual(['newton', 'damped', 'gmin', 'source', 'ptc']);
    expect(e.iterations).toBeGreaterThan(0);
  });

  it('measure and read throw SolveError for a circuit that does not solve (a loop of voltage sources)', () => {
    const loop = flat('t\nV1 a 0 5\nV2 a 0 3\nR1 a b 1k\nR2 b 0 1k\n');
    expect(() => measure(loop, { mode: 'dcv', red: 'b', black: '0' })).toThrow(SolveError);
    expect(() => read(parseNetlist('t\nV1 a 0 5\nV2 a 0 3\nR1 a b 1k\nR2 b 0 1k\n'), { mode: 'dcv', red: 'b', black: '0', power: 'on' })).toThrow(SolveError);
  });
});
