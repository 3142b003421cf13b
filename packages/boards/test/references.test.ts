import { describe, expect, it } from 'vitest';
import {
  bleedTime,
  busSafety,
  decodeColourBands,
  decodeSmdCode,
  E24,
  E96,
  eia96CodeFor,
  isPreferred,
  nearestPreferred,
  storedEnergy,
  timeConstant,
  voltageAfter,
  SAFE_THRESHOLDS,
  DEFAULT_SAFE_THRESHOLD,
  colourBandsFor,
} from '../src/references';

describe('bus safety', () => {
  it('resistor-calculator example: 10 kΩ, 470 µF, 400 V → 50 V', () => {
    expect(timeConstant(10e3, 470e-6)).toBeCloseTo(4.7, 9);
    expect(bleedTime(10e3, 470e-6, 400, 50)).toBeCloseTo(9.8, 1);
    expect(storedEnergy(470e-6, 400)).toBeCloseTo(37.6, 6);
    expect(voltageAfter(400, 10e3, 470e-6, bleedTime(10e3, 470e-6, 400, 50))).toBeCloseTo(50, 9);
  });
  it('TT electronics/Welwyn Design Tool #4 (Oxley 2005): 195 µF, 1500 V, 50 Ω → 320 V', () => {
    expect(bleedTime(50, 195e-6, 1500, 320) * 1000).toBeCloseTo(15.06, 2);
    expect(storedEnergy(195e-6, 1500)).toBeCloseTo(219.4, 1);
  });
  it('defaults to the IEC 60950-1 SELV 60 V d.c. threshold and carries cautions', () => {
    expect(DEFAULT_SAFE_THRESHOLD.volts).toBe(60);
    expect(DEFAULT_SAFE_THRESHOLD.standard).toBe('IEC 60950-1');
    const s = busSafety({ capacitanceF: 470e-6, bleederOhms: 300e3, busVolts: 358 });
    expect(s.bleedTimeS).toBeCloseTo(300e3 * 470e-6 * Math.log(358 / 60), 6);
    expect(s.cautions.join(' ')).toMatch(/local electrical codes/);
    const t = busSafety({ capacitanceF: 470e-6, busVolts: 358, threshold: SAFE_THRESHOLDS['appliance-34v'] });
    expect(t.bleedTimeS).toBeNull();
    expect(t.summary).toMatch(/no bleed path/);
  });
  it('rejects nonsense', () => {
    expect(() => bleedTime(-1, 1e-6, 10, 5)).toThrow(RangeError);
    expect(bleedTime(1e3, 1e-6, 30, 60)).toBe(0);
  });
});

describe('IEC 60062 colour bands', () => {
  it('4 band: yellow violet red gold = 4.7 kΩ 5 %', () => {
    expect(decodeColourBands('yellow violet red gold')).toMatchObject({ ohms: 4700, tolerance: 0.05 });
  });
  it('3 band has 20 % tolerance; gold multiplier is ×0.1', () => {
    expect(decodeColourBands(['brown', 'black', 'gold'])).toMatchObject({ ohms: 1, tolerance: 0.2 });
  });
  it('5 band: brown black black red brown = 10.0 kΩ 1 %', () => {
    expect(decodeColourBands('brown black black red brown')).toMatchObject({ ohms: 10000, tolerance: 0.01 });
  });
  it('6 band with temperature coefficient', () => {
    expect(decodeColourBands('orange orange black brown violet brown')).toMatchObject({ ohms: 3300, tolerance: 0.001, tempcoPpmK: 100 });
  });
  it('pink multiplier 10⁻³ and silver 10 %', () => {
    expect(decodeColourBands('red red pink silver').ohms).toBeCloseTo(0.022, 12);
  });
  it('refuses a gold digit and an undecoded grey tolerance', () => {
    expect(() => decodeColourBands('gold black red gold')).toThrow(/not a digit/);
    expect(() => decodeColourBands('red red red grey')).toThrow(/sources disagree/);
  });
  it('round-trips colourBandsFor', () => {
    for (const v of [4700, 10, 2.2, 680000]) expect(decodeColourBands(colourBandsFor(v)).ohms).toBeCloseTo(v, 9);
    expect(decodeColourBands(colourBandsFor(49.9, 0.01)).ohms).toBeCloseTo(49.9, 9);
  });
});

describe('SMD codes', () => {
  it.each([
    ['103', 10000],
    ['220', 22],
    ['4R7', 4.7],
    ['R47', 0.47],
    ['1002', 10000],
    ['10R0', 10],
    ['000', 0],
    ['01C', 10000],
    ['68X', 49.9],
    ['24A', 174],
    ['48B', 3090],
    ['01Z', 0.1],
  ])('%s = %d Ω', (c, v) => expect(decodeSmdCode(c as string).ohms).toBeCloseTo(v as number, 9));
  it('names the code system', () => {
    expect(decodeSmdCode('01C').system).toBe('EIA-96');
    expect(() => decodeSmdCode('99Q')).toThrow();
    expect(() => decodeSmdCode('00A')).toThrow(/out of range/);
  });
  it('encodes EIA-96', () => {
    expect(eia96CodeFor(10000)).toBe('01C');
    expect(eia96CodeFor(49.9)).toBe('68X');
    expect(eia96CodeFor(4700)).toBeNull();
  });
});

describe('IEC 60063 series', () => {
  it('E24 is the published table, not the formula', () => {
    expect(E24).toHaveLength(24);
    expect(E24.slice(10, 17)).toEqual([27, 30, 33, 36, 39, 43, 47]);
    expect(Math.round(10 * 10 ** (10 / 24))).toBe(26); // the formula would give 26 where the series has 27
  });
  it('E96 entries 24 and 48 (1-based) are 174 and 309', () => {
    expect(E96).toHaveLength(96);
    expect(E96[23]).toBe(174);
    expect(E96[47]).toBe(309);
    expect(E96[0]).toBe(100);
    expect(E96[95]).toBe(976);
  });
  it('nearest preferred value', () => {
    expect(nearestPreferred(4600, 'E12').value).toBe(4700);
    expect(nearestPreferred(4340, 'E24').value).toBe(4300);
    expect(nearestPreferred(9.9, 'E6').value).toBe(10);
    expect(nearestPreferred(175, 'E96').value).toBe(174);
    expect(nearestPreferred(0.0104, 'E24').value).toBe(0.01);
    expect(isPreferred(6800, 'E6')).toBe(true);
    expect(isPreferred(7500, 'E12')).toBe(false);
  });
});
