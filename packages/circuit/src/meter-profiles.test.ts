import { describe, expect, it } from 'vitest';
import { accuracyLimit, ANALOG_THEVENIN_20K, CC_AUTORANGE_6000, DEFAULT_METER, flatten, measure, parseNetlist, VT, type MeterProfile } from './index';

const read = (netlist: string, probe: { mode: 'dcv' | 'ohm' | 'diode' | 'continuity'; red: string; black: string }, meter: MeterProfile) =>
  measure(flatten(parseNetlist(`t\n${netlist}\n`)), probe, meter);

// A 10 kΩ resistor in series with a junction (IS = 1e-14 A, N = 1): V(I) = I·R + N·VT·ln(1 + I/IS) (Shockley's
// diode equation, Sedra & Smith, "Microelectronic Circuits", §4.2). A constant-current meter shows V/I at its test
// current; a Thevenin meter settles where its load line V = Voc − I·Rs meets V(I).
const JUNCTION = 'R1 a b 10k\nD1 b 0 dx\n.model dx D(IS=1e-14)';
const vOf = (i: number) => i * 10e3 + VT * Math.log1p(i / 1e-14);

describe('constant-current autoranging profile (values from memory, meter-profiles.ts)', () => {
  it('reads a plain resistor by Ohm’s law on the first range that holds it', () => {
    expect(read('R1 a 0 4.7k', { mode: 'ohm', red: 'a', black: '0' }, CC_AUTORANGE_6000).value).toBeCloseTo(4700, 3);
    expect(read('R1 a 0 47', { mode: 'ohm', red: 'a', black: '0' }, CC_AUTORANGE_6000).value).toBeCloseTo(47, 5);
    // The clamp junction carries GMIN = 1e-12 S as every SPICE junction does (ngspice dioload.c): 22 MΩ ∥ 1 TΩ.
    expect(read('R1 a 0 22meg', { mode: 'ohm', red: 'a', black: '0' }, CC_AUTORANGE_6000).value).toBeCloseTo(1 / (1 / 22e6 + 1e-12), -1);
  });

  it('through a junction it shows V/I at the test current of the lowest range not overloaded (checked range by range)', () => {
    const ranges = CC_AUTORANGE_6000.ohm.ranges!;
    // Independent of the meter's range search: every range's reading from the diode equation, the first that fits.
    const byRange = ranges.map((r) => vOf((r.source as { current: number }).current) / (r.source as { current: number }).current);
    const k = byRange.findIndex((x, j) => x <= ranges[j]!.full);
    expect(k).toBeGreaterThan(0);
    const shown = read(JUNCTION, { mode: 'ohm', red: 'a', black: '0' }, CC_AUTORANGE_6000).value as number;
    expect(Math.abs(shown / byRange[k]! - 1)).toBeLessThan(1e-4); // GMIN across the clamp, as above
  });

  it('the same junction path reads far lower on a Thevenin meter: the meter model decides the expected value', () => {
    const cc = read(JUNCTION, { mode: 'ohm', red: 'a', black: '0' }, CC_AUTORANGE_6000).value as number;
    const thev = read(JUNCTION, { mode: 'ohm', red: 'a', black: '0' }, ANALOG_THEVENIN_20K).value as number;
    expect(thev).toBeLessThan(cc / 2);
  });

  it('above 60 MΩ is OL on Ω, and on diode test the 3.2 V compliance is above the 3.000 V display: OL', () => {
    expect(read('R1 a 0 100meg', { mode: 'ohm', red: 'a', black: '0' }, CC_AUTORANGE_6000).value).toBe('OL');
    expect(read('R1 a 0 100meg', { mode: 'diode', red: 'a', black: '0' }, CC_AUTORANGE_6000).value).toBe('OL');
  });

  it('diode test: a junction at the 0.8 mA test current (Shockley, Sedra & Smith §4.2)', () => {
    const v = read('D1 a 0 dx\n.model dx D(IS=1e-14)', { mode: 'diode', red: 'a', black: '0' }, CC_AUTORANGE_6000).value as number;
    expect(v).toBeCloseTo(VT * Math.log1p(8e-4 / 1e-14), 3);
  });

  it('continuity uses the 600 Ω range current and beeps below 30 Ω', () => {
    expect(read('R1 a 0 25', { mode: 'continuity', red: 'a', black: '0' }, CC_AUTORANGE_6000).beep).toBe(true);
    expect(read('R1 a 0 47', { mode: 'continuity', red: 'a', black: '0' }, CC_AUTORANGE_6000).beep).toBe(false);
  });

  it('stated accuracy ±(0.5 % + 3 digits) on DC V and ±(1.0 % + 5 digits) on Ω, one digit being the range resolution', () => {
    expect(accuracyLimit(CC_AUTORANGE_6000, 'dcv', 5)).toBeCloseTo(0.005 * 5 + 3 * 0.001, 9);
    expect(accuracyLimit(CC_AUTORANGE_6000, 'dcv', 311)).toBeCloseTo(0.005 * 311 + 3 * 0.1, 9);
    expect(accuracyLimit(CC_AUTORANGE_6000, 'ohm', 100e3)).toBeCloseTo(0.01 * 100e3 + 5 * 100, 6);
    expect(accuracyLimit(CC_AUTORANGE_6000, 'ohm', 20e6)).toBeCloseTo(0.02 * 20e6 + 10 * 1e4, 3);
    expect(accuracyLimit(DEFAULT_METER, 'dcv', 5)).toBeUndefined();
  });
});

describe('analog-style Thevenin profile (values from memory, meter-profiles.ts)', () => {
  it('DC V loads the node with 20 kΩ/V × range and is read on the lowest range that holds it (voltmeter loading)', () => {
    // 10 V across 1 MΩ / 1 MΩ: on the 2.5 V range the meter's 50 kΩ sits across the lower 1 MΩ:
    // V = 10·(1M ∥ 50k)/(1M + 1M ∥ 50k) (voltage divider with a loaded leg, Alexander & Sadiku §2.7).
    const rp = 1 / (1 / 1e6 + 1 / 50e3);
    const v = read('V1 t 0 10\nR1 t a 1meg\nR2 a 0 1meg', { mode: 'dcv', red: 'a', black: '0' }, ANALOG_THEVENIN_20K).value as number;
    expect(v).toBeCloseTo((10 * rp) / (1e6 + rp), 6);
  });

  it('Ω on a series ohmmeter reads a resistor exactly; accuracy ±3 % of arc is 12 % of reading at centre scale', () => {
    expect(read('R1 a 0 1.5k', { mode: 'ohm', red: 'a', black: '0' }, ANALOG_THEVENIN_20K).value).toBeCloseTo(1500, 6);
    // Deflection Rc/(R + Rc): dR = 0.03·(R + Rc)²/Rc, at R = Rc = 2 kΩ (×100 range) that is 0.12·R.
    expect(accuracyLimit(ANALOG_THEVENIN_20K, 'ohm', 2e3)! / 2e3).toBeCloseTo(0.12, 9);
  });

  it('diode check on the ×10 range: the load line 1.5 V behind 200 Ω meets the junction (Sedra & Smith §4.3)', () => {
    const v = read('D1 a 0 dx\n.model dx D(IS=1e-14)', { mode: 'diode', red: 'a', black: '0' }, ANALOG_THEVENIN_20K).value as number;
    expect(Math.abs((1.5 - v) / 200 - 1e-14 * Math.expm1(v / VT))).toBeLessThan(1e-9);
  });
});
