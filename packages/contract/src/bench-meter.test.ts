// How the server reads a SCPI meter's answer to READ?: numbers as IEEE 488.2 sends them, overload as OL, and
// anything else refused with the text quoted.
import { describe, expect, it } from 'vitest';
import { instrumentName, readScpiNumber } from './bench-meter';
import { mayServeBenchMeterArm, mayUseBenchMeter } from './policy';

describe('readScpiNumber', () => {
  it('reads NR3 numbers with sign and exponent (IEEE 488.2, 8.7.4)', () => {
    expect(readScpiNumber('+3.1102E+02')).toEqual({ ok: true, value: 311.02 });
    expect(readScpiNumber('-1.4950E+01')).toEqual({ ok: true, value: -14.95 });
    expect(readScpiNumber('+4.70210000E+03\r')).toEqual({ ok: true, value: 4702.1 });
    expect(readScpiNumber('6.1200e-01')).toEqual({ ok: true, value: 0.612 });
  });
  it('reads NR1 and NR2 numbers', () => {
    expect(readScpiNumber('15')).toEqual({ ok: true, value: 15 });
    expect(readScpiNumber('0.612')).toEqual({ ok: true, value: 0.612 });
    expect(readScpiNumber('.5')).toEqual({ ok: true, value: 0.5 });
  });
  it('shows overload (±9.9E37, SCPI infinity) as OL, in any spelling', () => {
    for (const s of ['9.9E37', '+9.90000000E+37', '-9.9E+37', '9.9e37']) expect(readScpiNumber(s)).toEqual({ ok: true, value: 'OL' });
  });
  it('refuses SCPI not-a-number (9.91E37) and asks for the reading again', () => {
    const r = readScpiNumber('+9.91E+37');
    expect(r).toEqual({ ok: false, error: 'the meter answered "+9.91E+37" (not a number in SCPI): take the reading again' });
  });
  it('refuses what is not one number: text, units, lists, empty, infinity overflow', () => {
    for (const s of ['', 'OVLD', '311 V', '+3.1E+02,+3.2E+02', '0x1F', 'NaN', 'Infinity', '1E999', '--1', '1.2.3']) {
      const r = readScpiNumber(s);
      expect(r.ok, s).toBe(false);
    }
    expect(readScpiNumber('311 V')).toEqual({ ok: false, error: 'the meter answered "311 V", which is not a number' });
  });
});

describe('instrumentName', () => {
  it('takes maker and model from an *IDN? answer (IEEE 488.2, 10.14)', () => {
    expect(instrumentName('Invented Instruments,BM-2300,SN0042,1.07')).toBe('Invented Instruments BM-2300');
  });
  it('keeps any other answer as sent, cut to 100 characters', () => {
    expect(instrumentName('MY METER')).toBe('MY METER');
    expect(instrumentName('x'.repeat(150))).toHaveLength(100);
    expect(instrumentName('  ')).toBe('bench meter');
  });
});

describe('bench meter policy', () => {
  it('lets everyone who takes readings use a bench meter, signed out nobody', () => {
    expect(['trainee', 'tech', 'lead', 'admin'].every((r) => mayUseBenchMeter(r as 'tech'))).toBe(true);
    expect(mayUseBenchMeter(null)).toBe(false);
  });
  it('serves a request only to the bridge of the person who asked, in their shop', () => {
    const arm = { userId: 'u1', shopId: 's1' };
    expect(mayServeBenchMeterArm({ id: 'u1', shopId: 's1' }, arm)).toBe(true);
    expect(mayServeBenchMeterArm({ id: 'u2', shopId: 's1' }, arm)).toBe(false);
    expect(mayServeBenchMeterArm({ id: 'u1', shopId: 's2' }, arm)).toBe(false);
  });
});
