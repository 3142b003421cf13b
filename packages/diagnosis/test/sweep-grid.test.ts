/**
 * Twins at DC are weighed on one grid. A capacitor across a zener is indistinguishable from it by any powered or
 * unpowered reading while both are in circuit: shorted, either pulls the node to the same millivolts. The short's
 * resistance is unknown and the sweep is a quadrature of it, so the two parts' marginal likelihoods are equal only
 * when their sweeps share points (MacKay, "Information Theory, Inference, and Learning Algorithms", 2003, ch. 28,
 * the marginal likelihood of a parameterised model; from memory). Before, the diode's grid (0.5, 5, 50 Ω) against the
 * capacitors' (0.1 … 30 Ω) let a 0.3 Ω zener short rank the capacitor first at 0.99.
 */
import { describe, expect, it } from 'vitest';
import { createDiagnoser, DEFAULT_MODES } from '../src/index.js';

const NETLIST = `zener reference with its filter capacitor (invented)
.model DZ56 D(is=1e-14 n=1 bv=5.6 ibv=2m)
V1 vin 0 DC 24
R1 vin zb 1.5k
DZ1 0 zb DZ56
C1 zb 0 10u
RL zb 0 100k
.end`;

describe('short sweeps of twins', () => {
  it('capacitors and diodes share the short grid', () => {
    const sweep = (k: keyof typeof DEFAULT_MODES) => DEFAULT_MODES[k].find((m) => m.name === 'short')?.sweep;
    expect(sweep('diode')).toEqual(sweep('ceramic-capacitor'));
    expect(sweep('diode')).toEqual(sweep('electrolytic-capacitor'));
  });

  it('a 0.3 Ω zener short leaves the zener and its capacitor in the ratio of their priors, neither confident', () => {
    const d = createDiagnoser({ netlist: NETLIST });
    // 24 V × 0.3 / (1500 + 0.3) across the short (Ohm's law), read on a DC V range of 0.1 mV resolution.
    const out = d.update([{ mode: 'dcv', red: 'zb', black: '0', value: 0.0048, power: 'on' }], { top: 10 });
    const p = (part: string) =>
      out.candidates.find((c) => c.faults.length === 1 && c.faults[0]!.part === part && c.faults[0]!.mode === 'short')?.probability ?? 0;
    const prior = (k: 'diode' | 'electrolytic-capacitor') => DEFAULT_MODES[k].find((m) => m.name === 'short')!.prior;
    expect(p('DZ1') / p('C1')).toBeCloseTo(prior('diode') / prior('electrolytic-capacitor'), 1);
    expect(out.candidates[0]!.probability).toBeLessThan(0.9);
    // The test that tells them apart lifts one of them.
    expect(out.nextTests.some((t) => (t.lifted ?? []).length > 0)).toBe(true);
  });
});
