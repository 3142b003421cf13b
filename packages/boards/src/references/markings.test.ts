import { describe, expect, it } from 'vitest';
import { decodeCeramicCode, decodeElectrolyticRating } from './capacitor-markings';
import { decodeMarking } from './decode-marking';
import { colourBandsFor, decodeColourBands, decodeSmdCode, eia96CodeFor, MarkingError } from './markings';

describe('resistor colour bands (IEC 60062, colour-code charts citing the 2016 edition)', () => {
  it('4 bands: brown black orange gold = 10 kΩ ±5 %', () => {
    expect(decodeColourBands('brown black orange gold')).toMatchObject({ ohms: 10_000, tolerance: 0.05 });
  });
  it('5 bands: yellow violet black brown brown = 4.7 kΩ ±1 %', () => {
    expect(decodeColourBands(['yellow', 'violet', 'black', 'brown', 'brown'])).toMatchObject({ ohms: 4_700, tolerance: 0.01 });
  });
  it('3 bands carry no tolerance band: ±20 %; gold multiplier ×0.1: yellow violet gold = 4.7 Ω', () => {
    expect(decodeColourBands('yellow violet gold')).toMatchObject({ ohms: 4.7, tolerance: 0.2 });
  });
  it('6 bands add the temperature coefficient: brown 100 ppm/K', () => {
    expect(decodeColourBands('red red black red brown brown').tempcoPpmK).toBe(100);
  });
  it('refuses what it cannot read: grey tolerance (sources disagree), a digit band of gold', () => {
    expect(() => decodeColourBands('brown black red grey')).toThrow(/grey/);
    expect(() => decodeColourBands('gold black red gold')).toThrow(MarkingError);
  });
  it('the inverse draws 4.7 kΩ ±5 % as yellow violet red gold', () => {
    expect(colourBandsFor(4_700, 0.05)).toEqual(['yellow', 'violet', 'red', 'gold']);
  });
});

describe('SMD resistor codes (IEC 60062 letter-and-digit code; EIA-96)', () => {
  it('3-digit: 103 = 10 kΩ, 220 = 22 Ω; 4-digit: 1002 = 10.0 kΩ; R notation: 4R7 = 4.7 Ω', () => {
    expect(decodeSmdCode('103').ohms).toBe(10_000);
    expect(decodeSmdCode('220').ohms).toBe(22);
    expect(decodeSmdCode('1002')).toMatchObject({ ohms: 10_000, system: 'four-digit' });
    expect(decodeSmdCode('4R7').ohms).toBe(4.7);
  });
  it('EIA-96: 01C = 10 kΩ, 68X = 49.9 Ω, 24 = 174 and 48 = 309 (the values some web tables get wrong)', () => {
    expect(decodeSmdCode('01C').ohms).toBe(10_000);
    expect(decodeSmdCode('68X').ohms).toBeCloseTo(49.9, 9);
    expect(decodeSmdCode('24A').ohms).toBe(174);
    expect(decodeSmdCode('48A').ohms).toBe(309);
    expect(eia96CodeFor(10_000)).toBe('01C');
  });
  it('000 is a zero-ohm link; anything else is refused with the systems it knows', () => {
    expect(decodeSmdCode('000').system).toBe('zero-ohm');
    expect(() => decodeSmdCode('1K')).toThrow(/3-digit, 4-digit/);
  });
});

describe('ceramic capacitor codes (IEC 60062: picofarads, multiplier digit, tolerance letter)', () => {
  it('104 = 100 nF, 473J = 47 nF ±5 %, 102 = 1 nF, 224K 50V = 220 nF ±10 % rated 50 V', () => {
    expect(decodeCeramicCode('104').farads).toBeCloseTo(100e-9, 20);
    expect(decodeCeramicCode('473J')).toMatchObject({ tolerance: 0.05 });
    expect(decodeCeramicCode('473J').farads).toBeCloseTo(47e-9, 20);
    expect(decodeCeramicCode('102').farads).toBeCloseTo(1e-9, 20);
    expect(decodeCeramicCode('224K 50V')).toMatchObject({ tolerance: 0.1, volts: 50 });
  });
  it('small values: 4R7 = 4.7 pF, 2p2 = 2.2 pF, a plain 22 = 22 pF; C = ±0.25 pF', () => {
    expect(decodeCeramicCode('4R7').farads).toBeCloseTo(4.7e-12, 24);
    expect(decodeCeramicCode('2p2').farads).toBeCloseTo(2.2e-12, 24);
    expect(decodeCeramicCode('22').farads).toBeCloseTo(22e-12, 24);
    expect(decodeCeramicCode('1R0C').tolerancePf).toBe(0.25);
  });
  it('refuses multiplier digits 8 and 9 (charts disagree) and text that is no code', () => {
    expect(() => decodeCeramicCode('109')).toThrow(/not decoded/);
    expect(() => decodeCeramicCode('hello')).toThrow(MarkingError);
  });
});

describe('electrolytic sleeve ratings', () => {
  it('470µF 400V, 470uF/400V, 400V 470uF and 47MFD 25VDC', () => {
    for (const m of ['470µF 400V', '470uF/400V', '400V 470uF', '470 μF 400 V']) {
      const r = decodeElectrolyticRating(m);
      expect(r.farads).toBeCloseTo(470e-6, 15);
      expect(r.volts).toBe(400);
    }
    expect(decodeElectrolyticRating('47MFD 25VDC')).toMatchObject({ volts: 25 });
    expect(decodeElectrolyticRating('47MFD 25VDC').farads).toBeCloseTo(47e-6, 15);
  });
  it('needs both the capacitance and the voltage', () => {
    expect(() => decodeElectrolyticRating('470uF')).toThrow(/rated voltage/);
    expect(() => decodeElectrolyticRating('400V')).toThrow(/capacitance/);
  });
});

describe('decodeMarking picks the decoder by part kind', () => {
  it('resistor by colours or code, ceramic by code, electrolytic by sleeve', () => {
    expect(decodeMarking('resistor', 'orange orange brown gold').nominal).toBe(330);
    expect(decodeMarking('resistor', '472').nominal).toBe(4_700);
    expect(decodeMarking('ceramic-capacitor', '104').nominal).toBeCloseTo(100e-9, 20);
    expect(decodeMarking('electrolytic-capacitor', '470µF 400V')).toMatchObject({ volts: 400 });
    expect(() => decodeMarking('resistor', '')).toThrow(/type what is printed/);
  });
});
