import { describe, expect, it } from 'vitest';
import { parseReadingInput } from '../src/units';

// Inputs from issue 5; SI prefixes per the SI brochure (BIPM), letter-as-decimal-point code per IEC 60062.
const ok = (s: string, unit?: 'V' | 'ohm' | 'F' | 'A' | 'Hz') => {
  const r = parseReadingInput(s, unit);
  if (!r.ok) throw new Error(r.error);
  return r;
};

describe('parseReadingInput', () => {
  it.each([
    ['2.2k', 2200],
    ['4k7', 4700],
    ['100n', 1e-7],
    ['0.56', 0.56],
    ['14,9', 14.9],
    ['2M2', 2.2e6],
    ['4R7', 4.7],
    ['10m', 0.01],
    ['-0.3', -0.3],
  ])('%s → %d', (s, v) => {
    expect(ok(s).value).toBeCloseTo(v as number, 12);
  });

  it('keeps the typed unit', () => {
    expect(ok('312 V')).toMatchObject({ value: 312, unit: 'V' });
    expect(ok('1.5 MΩ')).toMatchObject({ value: 1.5e6, unit: 'ohm' });
    expect(ok('4.7 µF')).toMatchObject({ unit: 'F' });
    expect(ok('4.7 µF').value as number).toBeCloseTo(4.7e-6, 15);
    expect(ok('12 kHz')).toMatchObject({ value: 12000, unit: 'Hz' });
    expect(ok('14,9 V')).toMatchObject({ value: 14.9, unit: 'V' });
    expect(ok('4k7 ohm')).toMatchObject({ value: 4700, unit: 'ohm' });
    expect(ok('220 mV').value as number).toBeCloseTo(0.22, 12);
  });

  it('reads OL as overload', () => {
    expect(ok('OL').value).toBe('OL');
    expect(ok('o.l.').value).toBe('OL');
  });

  it('gives a clear error', () => {
    const r = parseReadingInput('abc');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.error).toMatch(/not a reading/);
    expect(parseReadingInput('').ok).toBe(false);
    expect(parseReadingInput('1,2.3').ok).toBe(false);
    expect(parseReadingInput('5 furlongs').ok).toBe(false);
    const wrong = parseReadingInput('312 V', 'ohm');
    expect(wrong.ok).toBe(false);
    if (!wrong.ok) expect(wrong.error).toMatch(/in V, but this reading is in ohm/);
  });

  it('applies the expected unit to a bare number', () => {
    expect(ok('2.2k', 'ohm')).toMatchObject({ value: 2200, unit: 'ohm' });
  });
});
