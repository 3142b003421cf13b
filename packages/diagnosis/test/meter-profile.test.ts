/**
 * Meter profiles in the diagnosis: expected values and bands are computed with the meter the readings were taken
 * with (packages/circuit meter-profiles.ts; values from memory), and the meter term of the noise model is the
 * profile's stated accuracy read as a rectangular distribution (JCGM 100:2008, the GUM, §4.3.7: σ = limit/√3).
 */
import { describe, expect, it } from 'vitest';
import { accuracyLimit, ANALOG_THEVENIN_20K, CC_AUTORANGE_6000 } from '@splitscope/circuit';
import { bandOf, createDiagnoser, type CaseReading } from '../src/index.js';

// An invented input section: a 10 kΩ feed into a signal diode's junction, 1 MΩ bleed across it.
const NETLIST = `junction section (invented)
V1 in 0 5
R1 in a 10k
D1 a 0 dsig
R2 a 0 1meg
.model dsig D(IS=2.5e-9 N=1.75)
.end`;
const ohmA: CaseReading = { mode: 'ohm', red: 'a', black: '0', power: 'off', value: 200e3 };

describe('meter profiles reach the noise model', () => {
  it('DC V σ_meter is the stated ±(0.5 % + 3 digits) over √3 (GUM §4.3.7)', async () => {
    const { scaleOf } = await import('../src/electrical/noise.js');
    expect(scaleOf('dcv', CC_AUTORANGE_6000).sigmaMeter(5)).toBeCloseTo((0.005 * 5 + 0.003) / Math.sqrt(3), 9);
    // An analog meter's ±3 % of full scale on the 10 V range is a wider band at 5 V than the handheld's.
    const cc = bandOf('dcv', { value: 5 }, CC_AUTORANGE_6000);
    const an = bandOf('dcv', { value: 5 }, ANALOG_THEVENIN_20K);
    expect(an.high! - an.low!).toBeGreaterThan(cc.high! - cc.low!);
    expect(accuracyLimit(ANALOG_THEVENIN_20K, 'dcv', 5)).toBeCloseTo(0.3, 9);
  });

  it('the expected Ω reading across a junction follows the meter chosen for the update', () => {
    const d = createDiagnoser({ netlist: NETLIST, meter: CC_AUTORANGE_6000 });
    const cc = d.update([ohmA]).readings[0]!;
    const analog = d.update([ohmA], { meter: ANALOG_THEVENIN_20K }).readings[0]!;
    expect(typeof cc.expected).toBe('number');
    expect(typeof analog.expected).toBe('number');
    // The constant-current meter's 60 MΩ… ranges drive nanoamps: the junction stays off and the 1 MΩ bleed shows;
    // the analog meter's 1.5 V behind its centre resistance forward-biases it and reads far lower.
    expect(cc.expected as number).toBeGreaterThan(3 * (analog.expected as number));
  }, 120_000);
});
