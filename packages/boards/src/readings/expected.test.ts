// Healthy values of the demo boards' main points, computed by the circuit engine from the composed netlists,
// checked against bands that name their source.
import { boardModelSchema } from '@splitscope/contract';
import { describe, expect, it } from 'vitest';
import { INDOOR_FAN_BOARD } from '../demo/indoor-fan';
import { OUTDOOR_FAN_BOARD } from '../demo/outdoor-fan';
import { expectedReadings, type ExpectedReading } from './expected';

const row = (rows: ExpectedReading[], tp: string, mode: string) => {
  const r = rows.find((x) => x.testPoint === tp && x.mode === mode);
  if (!r) throw new Error(`no ${mode} row for ${tp}`);
  return r;
};
const num = (r: ExpectedReading) => r.expected as number;
const busLow = (rms: number) => Math.SQRT2 * rms * 0.9 - 1.6;
const busHigh = (rms: number) => Math.SQRT2 * rms * 1.1 - 1.6;

describe('outdoor demo board OFD-220 (220 V mains)', () => {
  const rows = expectedReadings(OUTDOOR_FAN_BOARD);

  it('DC bus sits at √2 × mains RMS: within 220 V ±10 % less two bridge drops', () => {
    // Vdc ≈ √2·Vrms − 2·VF at light load (Power Integrations AN-17: the bulk capacitor charges to the line
    // peak; VF 0.8 V common practice): 198–242 V rms → 278.4–340.6 V [computed].
    const bus = row(rows, 'TP1', 'dcv');
    expect(num(bus)).toBeGreaterThan(busLow(220));
    expect(num(bus)).toBeLessThan(busHigh(220));
    expect(bus.low).toBeCloseTo(278.4, 1);
    expect(bus.high).toBeCloseTo(340.6, 1);
    expect(bus.source).toMatch(/AN-17/);
  });

  it('15 V rail within the MC7815C output band 14.25–15.75 V (onsemi MC7800 series datasheet)', () => {
    const v15 = row(rows, 'TP3', 'dcv');
    expect(num(v15)).toBeGreaterThanOrEqual(14.25);
    expect(num(v15)).toBeLessThanOrEqual(15.75);
    expect([v15.low, v15.high]).toEqual([14.25, 15.75]);
    expect(v15.source).toMatch(/MC7800/);
  });

  it('switched fan supply within 13.9–15.75 V: the 15 V band less a saturated PNP drop (computed, common practice)', () => {
    const vfan = row(rows, 'TP5', 'dcv');
    expect(num(vfan)).toBeGreaterThanOrEqual(13.9);
    expect(num(vfan)).toBeLessThanOrEqual(15.75);
    expect(num(vfan)).toBeLessThan(num(row(rows, 'TP3', 'dcv')));
  });

  it('speed command within the motor input range of roughly 1–7 V (common practice, from memory)', () => {
    const vsp = row(rows, 'TP9', 'dcv');
    expect(num(vsp)).toBeGreaterThanOrEqual(1);
    expect(num(vsp)).toBeLessThanOrEqual(7);
    // 15 V · (2.2k ∥ 20k) / (3.9k + 2.2k ∥ 20k) with Q3 saturated: ≈ 5.0 V [computed by hand].
    expect(num(vsp)).toBeCloseTo(5.04, 1);
  });

  it('every test point has its powered and unpowered rows, ids stable', () => {
    expect(OUTDOOR_FAN_BOARD.testPoints.map((t) => t.id)).toEqual(Array.from({ length: 12 }, (_, i) => `TP${i + 1}`));
    for (const tp of OUTDOOR_FAN_BOARD.testPoints) {
      expect(rows.filter((r) => r.testPoint === tp.id).map((r) => `${r.power}:${r.mode}`)).toEqual(['on:dcv', 'off:ohm', 'off:diode', 'off:continuity']);
    }
  });
});

describe('indoor demo board IDF-310 (230 V mains)', () => {
  const rows = expectedReadings(INDOOR_FAN_BOARD);
  const tp = (net: string) => INDOOR_FAN_BOARD.testPoints.find((t) => t.net === net)!.id;

  it('DC bus within 230 V ±10 % less two bridge drops (AN-17; common practice): 291.1–356.2 V', () => {
    const bus = row(rows, tp('vbus'), 'dcv');
    expect(num(bus)).toBeGreaterThan(busLow(230));
    expect(num(bus)).toBeLessThan(busHigh(230));
  });

  it('15 V rail within 14.25–15.75 V (onsemi MC7800 series datasheet, MC7815C)', () => {
    const v15 = row(rows, tp('v15'), 'dcv');
    expect(num(v15)).toBeGreaterThanOrEqual(14.25);
    expect(num(v15)).toBeLessThanOrEqual(15.75);
  });

  it('5 V controller rail on the cold side within 4.75–5.25 V (LM78xx datasheet, Fairchild DS400018), read against the cold ground', () => {
    const v5 = row(rows, tp('vcc5_c'), 'dcv');
    expect(v5.black).toBe('gnd_c');
    expect(num(v5)).toBeGreaterThanOrEqual(4.75);
    expect(num(v5)).toBeLessThanOrEqual(5.25);
    expect(v5.source).toMatch(/DS400018/);
  });

  it('switched 15 V within 13.9–15.75 V and speed command within 1–7 V (sources as above)', () => {
    const sw = row(rows, tp('v15sw'), 'dcv');
    expect(num(sw)).toBeGreaterThanOrEqual(13.9);
    expect(num(sw)).toBeLessThanOrEqual(15.75);
    const vsp = row(rows, tp('vsp'), 'dcv');
    expect(num(vsp)).toBeGreaterThanOrEqual(1);
    expect(num(vsp)).toBeLessThanOrEqual(7);
  });

  it('the speed-command load pair reads 12k ∥ 6.8k ≈ 4.34 kΩ in circuit, and the row says so', () => {
    // 12 kΩ ∥ 6.8 kΩ = 4.340 kΩ [computed; ngspice agrees]. In-circuit resistance reads every parallel path
    // (TekPower TP40 manual); the meter's 0.5 V test source leaves the zener and the transistor off.
    const ohm = row(rows, tp('vsp'), 'ohm');
    expect(num(ohm)).toBeGreaterThan(4340 * 0.99);
    expect(num(ohm)).toBeLessThan(4340 * 1.01);
    expect(ohm.note).toContain('reads 12k ∥ 6.8k ≈ 4.34 kΩ in circuit: parallel path through R405 and R406');
  });

  it('the table is cached per model', () => {
    expect(expectedReadings(INDOOR_FAN_BOARD)).toBe(rows);
    expect(expectedReadings(boardModelSchema.parse(structuredClone(INDOOR_FAN_BOARD)))).not.toBe(rows);
  });
});

describe('a bare netlist with test points (the server accepts those too)', () => {
  it('a divider of 15 V read by the default 10 MΩ meter, and its resistance', () => {
    const rows = expectedReadings({
      netlist: '* divider\nVS in 0 DC 15\nR1 in mid 10k\nR2 mid 0 10k\n.end\n',
      testPoints: [{ id: 'TP1', net: 'mid' }],
    });
    // 15 · 9.990k / 19.990k = 7.496 V (the lower 10k loaded by 10 MΩ; meter input resistance from memory).
    expect(num(row(rows, 'TP1', 'dcv'))).toBeCloseTo(7.496, 3);
    // Unpowered, the source is open: R2 alone, 10 kΩ.
    expect(num(row(rows, 'TP1', 'ohm'))).toBeCloseTo(10_000, -1);
    expect(row(rows, 'TP1', 'ohm').note).toBeUndefined();
  });
});
