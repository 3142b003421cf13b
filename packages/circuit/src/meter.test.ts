import { describe, expect, it } from 'vitest';
import {
  applyState,
  DEFAULT_METER,
  flatten,
  measure,
  measureDetailed,
  MeasurementError,
  meterProfile,
  parseNetlist,
  read,
  resistor,
  stateOf,
  withoutParts,
  type Circuit,
} from './index';

const SECTION = parseNetlist(`fan supply section (invented)
.param FAN_ON=1
VBUS p 0 15
RSENSE p p2 0.5
VSNS p2 p3 0
R1 p3 vfan 1k
R2 vfan 0 2k
C2 vfan 0 10u
D1 vfan k1 dsi
RK k1 0 100k
VCTL ctl 0 {FAN_ON*5}
RCTL ctl 0 10k
.model dsi D(IS=2.5e-9 N=1.75 RS=0.6)
.end`);

const ohm = (c: Circuit, red: string, black: string) => measure(c, { mode: 'ohm', red, black }).value;

describe('board states', () => {
  it('power off removes non-zero independent sources and keeps zero-valued V sources as shorts', () => {
    const c = applyState(SECTION, { power: 'off' });
    const names = c.elements.map((e) => e.name);
    expect(names).not.toContain('VBUS');
    expect(names).not.toContain('VCTL');
    expect(names).toContain('VSNS');
  });
  it('a parameter override changes the powered circuit (FAN_ON=0 makes VCTL a 0 V source that stays when off)', () => {
    expect(applyState(SECTION, { power: 'off', params: { FAN_ON: 0 } }).elements.map((e) => e.name)).toContain('VCTL');
  });
  it('lifting an unknown part is a clear error', () => {
    expect(() => applyState(SECTION, { power: 'off', lifted: ['C99'] })).toThrow(/cannot lift "C99"/);
  });
});

describe('ohm function (Ohm’s law on the meter’s Thevenin test source)', () => {
  it('12 kΩ ∥ 6.8 kΩ reads 4.340 kΩ in circuit (parallel resistance, Alexander & Sadiku §2.7)', () => {
    const c = flatten(parseNetlist('t\nR1 a 0 12k\nR2 a 0 6.8k\n'));
    expect(ohm(c, 'a', '0')).toBeCloseTo((12e3 * 6.8e3) / 18.8e3, 6);
    expect(ohm(c, 'a', '0')).toBeCloseTo(4340.43, 1);
  });
  it('unpowered section: R2 ∥ (R1 + RSENSE) from vfan; the bus side dangles once VBUS is removed', () => {
    const c = applyState(SECTION, { power: 'off' });
    // D1 in series with 100k hangs on vfan too, but the 0.5 V test source leaves it essentially off.
    const v = ohm(c, 'vfan', '0') as number;
    expect(v).toBeGreaterThan(1999);
    expect(v).toBeLessThanOrEqual(2000);
    expect(ohm(c, 'p', 'vfan')).toBeCloseTo(1000.5, 6); // p → RSENSE 0.5 Ω → VSNS (short) → R1 1 kΩ → vfan
  });
  it('lifted parts open their paths; an isolated pad reads OL and islands elsewhere do not fail the reading', () => {
    const c = applyState(SECTION, { power: 'off', lifted: ['R2', 'D1'] });
    expect(ohm(c, 'vfan', '0')).toBe('OL');
    expect(ohm(c, 'k1', '0')).toBeCloseTo(100e3, 3); // k1 only has RK once D1 is lifted
    expect(ohm(c, 'ctl', '0')).toBeCloseTo(10e3, 6);
  });
  it('a short fault (0.01 Ω) reads near 0 and beeps on continuity; an open reads OL (common practice)', () => {
    const c = applyState(SECTION, { power: 'off' });
    const shorted = { ...c, elements: [...c.elements, resistor('FAULT', 'vfan', '0', 0.01)] };
    expect(ohm(shorted, 'vfan', '0') as number).toBeLessThan(0.011);
    expect(measure(shorted, { mode: 'continuity', red: 'vfan', black: '0' })).toEqual({ value: expect.any(Number), unit: 'ohm', beep: true });
    const open = withoutParts(c, ['RCTL']);
    expect(ohm(open, 'ctl', '0')).toBe('OL');
  });
  it('continuity beeps below the documented 50 Ω threshold only and reads OL above its 600 Ω range', () => {
    const mk = (r: number) => flatten(parseNetlist(`t\nR1 a 0 ${r}\n`));
    expect(measure(mk(10), { mode: 'continuity', red: 'a', black: '0' }).beep).toBe(true);
    const r100 = measure(mk(100), { mode: 'continuity', red: 'a', black: '0' });
    expect(r100.beep).toBe(false);
    expect(r100.value).toBeCloseTo(100, 6);
    expect(measure(mk(1e3), { mode: 'continuity', red: 'a', black: '0' })).toEqual({ value: 'OL', unit: 'ohm', beep: false });
  });
  it('reads OL above the meter range and a profile can change the range', () => {
    const c = flatten(parseNetlist('t\nR1 a 0 100meg\n'));
    expect(ohm(c, 'a', '0')).toBe('OL');
    expect(measure(c, { mode: 'ohm', red: 'a', black: '0' }, meterProfile({ ohm: { overRange: 1e9 } })).value).toBeCloseTo(100e6, -1);
  });
});

describe('diode function', () => {
  const net = parseNetlist('t\nD1 a k dsi\nQ1 c b e qn\nR1 a 0 1meg\n.model dsi D(IS=2.5e-9 N=1.75 RS=0.6)\n.model qn NPN(IS=1e-14 BF=200)\n');
  const c = flatten(net, undefined, { checkDcPaths: false });
  const dio = (circuit: Circuit, red: string, black: string) => measure(circuit, { mode: 'diode', red, black }).value;
  it('a silicon junction forward reads 0.5–0.8 V (common practice; meter manuals quote 0.4–0.8 V, ~0.6 V typical)', () => {
    const v = dio(c, 'a', 'k') as number;
    expect(v).toBeGreaterThan(0.5);
    expect(v).toBeLessThan(0.8);
    const vbe = dio(c, 'b', 'e') as number;
    expect(vbe).toBeGreaterThan(0.5);
    expect(vbe).toBeLessThan(0.8);
    const vbc = dio(c, 'b', 'c') as number;
    expect(vbc).toBeGreaterThan(0.5);
    expect(vbc).toBeLessThan(0.8);
  });
  it('reverse junction and collector–emitter read OL (common practice)', () => {
    expect(dio(c, 'k', 'a')).toBe('OL');
    expect(dio(c, 'c', 'e')).toBe('OL');
  });
  it('a shorted junction reads near 0 V, an open junction OL (common practice)', () => {
    const shorted = { ...c, elements: [...c.elements.filter((e) => e.name !== 'D1'), resistor('D1', 'a', 'k', 0.05)] };
    expect(dio(shorted, 'a', 'k') as number).toBeLessThan(0.01);
    expect(dio(withoutParts(c, ['D1']), 'a', 'k')).toBe('OL');
  });
  it('the test current is about 1 mA into a silicon junction (default profile, typical value from memory)', () => {
    const v = dio(c, 'a', 'k') as number;
    const i = (DEFAULT_METER.diode.openCircuitVoltage - v) / DEFAULT_METER.diode.sourceResistance;
    expect(i).toBeGreaterThan(0.8e-3);
    expect(i).toBeLessThan(1.2e-3);
  });
});

describe('dcv function and refusals', () => {
  it('dcv reads red minus black on the powered board, loaded by the meter input resistance', () => {
    const c = applyState(SECTION, { power: 'on' });
    const ideal = meterProfile({ dcv: { inputResistance: Infinity } });
    const v = measure(c, { mode: 'dcv', red: 'vfan', black: '0' }, ideal).value as number;
    // hand divider with the diode branch: vfan sits just under 15·2/3.0005 (D1 + 100k draws a little)
    expect(v).toBeLessThan((15 * 2e3) / 3000.5);
    expect(v).toBeGreaterThan(9.9);
    const loaded = measure(c, { mode: 'dcv', red: 'vfan', black: '0' }).value as number;
    expect(loaded).toBeLessThan(v);
    expect(v - loaded).toBeLessThan(1e-3);
    expect(measure(c, { mode: 'dcv', red: '0', black: 'vfan' }, ideal).value).toBeCloseTo(-v, 12);
  });
  it('refuses dcv unpowered and ohm/diode/continuity powered, giving the safety and meter-damage reasons', () => {
    expect(() => read(SECTION, { mode: 'dcv', red: 'vfan', black: '0', power: 'off' })).toThrow(MeasurementError);
    for (const mode of ['ohm', 'diode', 'continuity'] as const) {
      let msg = '';
      try {
        read(SECTION, { mode, red: 'vfan', black: '0', power: 'on' });
      } catch (e) {
        expect(e).toBeInstanceOf(MeasurementError);
        msg = (e as Error).message;
      }
      expect(msg).toMatch(/Safety:/);
      expect(msg).toMatch(/Meter damage:/);
    }
    let dcvMsg = '';
    try {
      read(SECTION, { mode: 'dcv', red: 'vfan', black: '0', power: 'off' });
    } catch (e) {
      dcvMsg = (e as Error).message;
    }
    expect(dcvMsg).toMatch(/Safety:/);
    expect(dcvMsg).toMatch(/Meter damage:/);
  });
  it('read applies state and takes the reading', () => {
    expect(read(SECTION, { mode: 'ohm', red: 'ctl', black: '0', power: 'off' }).value).toBeCloseTo(10e3, 6);
    expect(read(SECTION, { mode: 'dcv', red: 'ctl', black: '0', power: 'on', params: { FAN_ON: 0 } }).value).toBe(0);
  });
  it('a probe on a net that is not in the circuit is a clear error naming the net', () => {
    const c = stateOf(flatten(SECTION), { power: 'off' });
    expect(() => measure(c, { mode: 'ohm', red: 'nosuch', black: '0' })).toThrow('red probe: net "nosuch" is not in the circuit');
    expect(() => measure(c, { mode: 'ohm', red: 'vfan', black: 'vx' })).toThrow('black probe: net "vx" is not in the circuit');
  });
});

describe('measure with a warm start', () => {
  it('reads the same on a variant whether or not it starts from the healthy board’s solution', () => {
    const healthy = applyState(SECTION, { power: 'on' });
    const probe = { mode: 'dcv' as const, red: 'vfan', black: '0' };
    const first = measureDetailed(healthy, probe);
    expect(first.x).toBeInstanceOf(Float64Array);
    const variant: Circuit = {
      ...healthy,
      elements: healthy.elements.map((e) => (e.kind === 'R' && e.name === 'RSENSE' ? { ...e, value: 2 } : e)),
    };
    const cold = measure(variant, probe);
    const warm = measureDetailed(variant, probe, DEFAULT_METER, { solve: { initialGuess: first.x } });
    expect(warm.reading.value as number).toBeCloseTo(cold.value as number, 9);
    expect(warm.reading.value).not.toBe(first.reading.value);
  });
});
