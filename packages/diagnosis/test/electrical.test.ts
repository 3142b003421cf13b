/**
 * Electrical adapter units: case validation messages, part kinds and modes, fault rewriting, the warm-started
 * meter against @splitscope/circuit `measure`, and the noise model.
 */
import { describe, expect, it } from 'vitest';
import { flatten, measure, parseNetlist, stateOf } from '@splitscope/circuit';
import { applyFaults, buildParts, CaseError, createDiagnoser, readingLogLikelihood, validateCaseShape } from '../src/index.js';
import { meterReading } from '../src/electrical/meter.js';
import { DEFAULT_METER } from '@splitscope/circuit';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive.js';

const nl = parseNetlist(FAN_DRIVE_NETLIST);
const flat = flatten(nl, {});

describe('case validation', () => {
  const d = createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });
  const ok = { mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 1 };
  const msg = (readings: unknown[]) => {
    try {
      d.observations(readings);
    } catch (e) {
      expect(e).toBeInstanceOf(CaseError);
      return (e as Error).message;
    }
    return 'no error';
  };
  it('names the reading and the problem in one line', () => {
    expect(msg([ok, ok, ok, { ...ok, red: 'vfna' }])).toBe('reading 3: unknown net vfna');
    expect(msg([{ ...ok, power: 'off' }])).toMatch(/^reading 0: dcv is read with the board powered/);
    expect(msg([{ mode: 'ohm', red: 'vfan', black: '0', power: 'on', value: 3 }])).toMatch(/^reading 0: ohm is read with the board unplugged/);
    expect(msg([{ ...ok, value: 'abc' }])).toBe('reading 0: value must be a number, got "abc"');
    expect(msg([{ mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: 5 }])).toMatch(/^reading 0: continuity value must be true/);
    expect(msg([{ mode: 'ohm', red: 'vfan', black: 'gnd', power: 'off', lifted: ['C99'], value: 'OL' }])).toBe('reading 0: unknown part C99 in lifted');
    expect(msg([ok])).toBe('no error');
  });
  it('rejects a bad case shape and bad part overrides', () => {
    expect(() => validateCaseShape({ netlist: '', readings: [] })).toThrow(/^netlist:/);
    expect(() => validateCaseShape({ netlist: 'x', readings: {} })).toThrow('readings: must be a list');
    expect(() => createDiagnoser({ netlist: FAN_DRIVE_NETLIST, parts: { R99: { kind: 'resistor' } } })).toThrow('parts: unknown part R99');
    expect(() => createDiagnoser({ netlist: FAN_DRIVE_NETLIST, parts: { R9: { priors: { melt: 0.1 } } } })).toThrow(/parts\.R9: unknown mode melt/);
  });
});

describe('parts and modes', () => {
  const parts = buildParts(nl, flat, { XVREG: { kind: 'regulator' }, R9: { priors: { open: 0.02 } } });
  const by = (n: string) => parts.find((p) => p.name === n)!;
  it('infers kinds from the element letter and value', () => {
    expect(by('R9').kind).toBe('resistor');
    expect(by('C8').kind).toBe('electrolytic-capacitor');
    expect(by('C9').kind).toBe('ceramic-capacitor');
    expect(by('D3').kind).toBe('diode');
    expect(by('Q1').kind).toBe('bjt');
    expect(by('XU1').kind).toBe('opto-coupler');
    expect(by('VBUS').modes).toEqual([]);
    expect(by('Q1').modes.map((m) => m.name)).toEqual(['ce-short', 'be-open', 'bc-open', 'be-short']);
  });
  it('subcircuit modes are element:mode of internal elements; the annotated regulator gets regulator modes', () => {
    const names = by('XU1').modes.map((m) => m.name);
    expect(names).toContain('dl:open');
    expect(names).toContain('q1:ce-short');
    expect(names).toContain('f1:open');
    expect(names.some((n) => n.startsWith('rbe:'))).toBe(false);
    expect(by('XVREG').modes.map((m) => m.name)).toEqual(['dead', 'out-short', 'in-out-short', 'current-limit']);
  });
  it('applies prior overrides per part', () => {
    expect(by('R9').modes.find((m) => m.name === 'open')?.prior).toBe(0.02);
    expect(by('R9').modes.find((m) => m.name === 'open')?.source).toBe('override');
  });
  it('rewrites the circuit: a 0.1 Ω short on C9 pulls VFAN to tens of millivolts, not zero', () => {
    const pb = new Map(parts.map((p) => [p.name, p]));
    const on = stateOf(flat, { power: 'on' });
    const shorted = applyFaults(on, [{ component: 'C9', mode: 'short', point: 0, value: 0.1 }], pb);
    const v = measure(shorted, { mode: 'dcv', red: 'vfan', black: '0' }).value as number;
    expect(v).toBeGreaterThan(0.005);
    expect(v).toBeLessThan(0.2);
    const open = applyFaults(on, [{ component: 'Q1', mode: 'be-open', point: 0, value: NaN }], pb);
    expect(measure(open, { mode: 'dcv', red: 'vfan', black: '0' }).value as number).toBeLessThan(0.01);
    expect(measure(open, { mode: 'dcv', red: 'v15', black: '0' }).value as number).toBeGreaterThan(14.5);
  });
});

describe('warm-started meter matches measure()', () => {
  const parts = buildParts(nl, flat);
  const pb = new Map(parts.map((p) => [p.name, p]));
  const cases = [
    { faults: [], state: 'on' as const },
    { faults: [{ component: 'C9', mode: 'short', point: 1, value: 0.3 }], state: 'off' as const },
    { faults: [{ component: 'XU1', mode: 'dl:open', point: 1, value: 1e9 }], state: 'on' as const },
  ];
  for (const c of cases) {
    it(`${c.faults.map((f) => f.component + ':' + f.mode).join() || 'healthy'} (${c.state})`, () => {
      const circ = applyFaults(stateOf(flat, { power: c.state }), c.faults, pb);
      const healthy = stateOf(flat, { power: c.state });
      const modes = c.state === 'on' ? (['dcv'] as const) : (['ohm', 'continuity', 'diode'] as const);
      for (const mode of modes) {
        for (const net of ['vfan', 'b1', 'v15']) {
          const probe = { mode, red: net, black: '0' };
          const guess = meterReading(healthy, probe, DEFAULT_METER).nodes;
          const mine = meterReading(circ, probe, DEFAULT_METER, guess).prediction;
          const ref = measure(circ, probe);
          if (typeof ref.value === 'number') expect(mine.value as number).toBeCloseTo(ref.value, 4);
          else expect(mine.value).toBe(ref.value);
          if (ref.beep !== undefined) expect(mine.beep).toBe(ref.beep);
        }
      }
    });
  }
});

describe('noise model', () => {
  it('a far-off reading costs a bounded amount (heavy tail), a close one almost nothing', () => {
    const near = readingLogLikelihood('dcv', 15.0, { value: 15.0 }, DEFAULT_METER);
    const far = readingLogLikelihood('dcv', 0.05, { value: 15.0 }, DEFAULT_METER);
    expect(near - far).toBeGreaterThan(5);
    expect(near - far).toBeLessThan(15);
    expect(Number.isFinite(far)).toBe(true);
  });
  it('ohm is scored in log space; OL against a number is a small confusion probability', () => {
    const a = readingLogLikelihood('ohm', 1100, { value: 1000 }, DEFAULT_METER);
    const b = readingLogLikelihood('ohm', 11000, { value: 10000 }, DEFAULT_METER);
    // The same relative error scores the same at 1 kΩ and 10 kΩ (density in ln R).
    expect(a).toBeCloseTo(b, 3);
    expect(readingLogLikelihood('ohm', 2000, { value: 1000 }, DEFAULT_METER)).toBeLessThan(a - 5);
    expect(Math.exp(readingLogLikelihood('ohm', 'OL', { value: 1000 }, DEFAULT_METER))).toBeCloseTo(0.01, 3);
    expect(Math.exp(readingLogLikelihood('ohm', 'OL', { value: 'OL' }, DEFAULT_METER))).toBeCloseTo(0.99, 3);
  });
  it('continuity beep follows the meter threshold', () => {
    expect(Math.exp(readingLogLikelihood('continuity', true, { value: 1 }, DEFAULT_METER))).toBeGreaterThan(0.98);
    expect(Math.exp(readingLogLikelihood('continuity', true, { value: 1300 }, DEFAULT_METER))).toBeLessThan(0.02);
  });
});
