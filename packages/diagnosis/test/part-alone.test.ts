/**
 * A lifted part measured out of circuit, on its own pins (src/electrical/part-alone.ts), on the demo fan-drive
 * board. Checks and their sources:
 * - Ω across a capacitor alone: open at DC, so OL (the meter's over-range, `DEFAULT_METER.ohm.overRange`, a
 *   handheld value from memory); a shorted or leaky one reads the fault's resistance (Ohm's law, the meter
 *   model reads V/I of its own source).
 * - A resistor alone reads its value (R9 = 10 kΩ as written in the netlist), where in circuit the bench reads it
 *   in parallel with the rest of VFAN.
 * - Diode test on a diode alone: the Shockley equation (Sedra & Smith, Microelectronic Circuits, ch. 4) with the
 *   netlist's model (is, n) at the current the meter's diode source drives (open-circuit voltage over source
 *   resistance, `DEFAULT_METER.diode`), solved here by fixed point; reversed, OL.
 * - Scoring: with C10 lifted, C10 alone reading a few ohms makes "C10 — shorted" the diagnosis; reading OL
 *   clears it (the reading is evidence about C10 only).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_METER } from '@splitscope/circuit';
import { createDiagnoser, partAloneTable, type CaseReading, type Diagnoser } from '../src/index.js';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive.js';

let d: Diagnoser;
beforeAll(() => {
  d = createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });
}, 120_000);

/** The diode-test reading of a junction (is, n) alone: V = n·Vt·ln(I/is + 1) with I = (Voc − V) / Rs. */
function shockleyReading(is: number, n: number): number {
  const vt = (1.38064852e-23 * 300.15) / 1.6021766208e-19; // kT/q at 27 °C, SPICE's nominal temperature (CODATA 2014 constants)
  const { openCircuitVoltage: voc, sourceResistance: rs } = DEFAULT_METER.diode;
  let v = 0.6;
  for (let i = 0; i < 200; i++) v = n * vt * Math.log((voc - v) / rs / is + 1);
  return v;
}

describe('a lifted part on its own pins: what the engine expects', () => {
  it('C10 (10 nF) alone reads OL on Ω healthy, and its short or leak at the fault’s own resistance', () => {
    const rows = partAloneTable(d.model, 'C10', { mode: 'ohm', red: 'vfan', black: '0' });
    expect(rows[0]).toEqual({ mode: null, prediction: { value: 'OL' } });
    const shorts = rows.filter((r) => r.mode === 'short');
    expect(shorts.length).toBeGreaterThan(3);
    for (const r of [...shorts, ...rows.filter((x) => x.mode === 'leaky')]) expect(r.prediction.value).toBeCloseTo(r.point!, 6);
    // The board reading across the same pads with C10 lifted is the rest of VFAN, not C10.
    const onBoard = d.model.healthyPrediction({ mode: 'ohm', red: 'vfan', black: '0', power: 'off', lifted: ['C10'] });
    expect(onBoard.value).toBeLessThan(10e3);
  });

  it('beeps on continuity only when shorted', () => {
    const rows = partAloneTable(d.model, 'C10', { mode: 'continuity', red: 'vfan', black: '0' });
    expect(rows[0]!.prediction).toMatchObject({ value: 'OL', beep: false });
    for (const r of rows.filter((x) => x.mode === 'short' && x.point! < DEFAULT_METER.continuity.threshold)) expect(r.prediction.beep).toBe(true);
  });

  it('R9 alone reads its 10 kΩ; open, it reads the open mode’s resistance or OL above the meter’s range', () => {
    const rows = partAloneTable(d.model, 'R9', { mode: 'ohm', red: 'vfan', black: '0' });
    expect(rows[0]!.prediction.value).toBeCloseTo(10e3, 3);
    for (const r of rows.filter((x) => x.mode === 'open')) {
      if (r.point! > DEFAULT_METER.ohm.overRange) expect(r.prediction.value).toBe('OL');
      else expect(r.prediction.value).toBeCloseTo(r.point!, -1);
    }
  });

  it('D3 alone reads its forward drop by the Shockley equation, OL reversed, and OL open', () => {
    const fwd = partAloneTable(d.model, 'D3', { mode: 'diode', red: '0', black: 'vfan' }); // D3 0 vfan DS: anode on 0
    const expected = shockleyReading(2.5e-9, 1.75); // .model DS D(is=2.5e-9 n=1.75)
    expect(fwd[0]!.prediction.value as number).toBeCloseTo(expected, 3);
    expect(fwd.find((r) => r.mode === 'open')!.prediction.value).toBe('OL');
    expect(partAloneTable(d.model, 'D3', { mode: 'diode', red: 'vfan', black: '0' })[0]!.prediction.value).toBe('OL');
  });

  it('the opto U1’s LED alone reads its drop; "LED open" reads OL; its output-side faults leave the LED reading as it is', () => {
    const rows = partAloneTable(d.model, 'XU1', { mode: 'diode', red: 'la', black: '0' });
    expect(rows[0]!.prediction.value as number).toBeCloseTo(shockleyReading(1e-20, 1.8), 3); // .model DLED D(is=1e-20 n=1.8)
    for (const r of rows.filter((x) => x.mode === 'dl:open')) expect(r.prediction.value).toBe('OL');
    for (const r of rows.filter((x) => x.mode?.startsWith('q1:'))) expect(r.prediction.value).toBeCloseTo(rows[0]!.prediction.value as number, 6);
  });
});

describe('a lifted part on its own pins: scored as evidence about that part', () => {
  // A dead VFAN with a healthy 15 V rail and a beeping rail (fan-drive.test.ts), then C10 lifted and measured alone.
  const dead: CaseReading[] = [
    { mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 14.98 },
    { mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 0.05 },
    { mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: true },
  ];
  const alone = (value: number | 'OL'): CaseReading => ({ mode: 'ohm', red: 'vfan', black: '0', power: 'off', lifted: ['C10'], alone: 'C10', value });
  const top = (r: CaseReading[]) => d.update(r).candidates[0]!;

  it('C10 alone at 2 Ω makes "C10 — shorted" the diagnosis, with the reading counted for it', () => {
    const out = d.update([...dead, alone(2)]);
    const best = out.candidates[0]!;
    expect(best.faults).toEqual([{ part: 'C10', mode: 'short' }]);
    expect(best.probability).toBeGreaterThan(0.9);
    expect(best.evidence.find((e) => e.reading === 3)?.effect).toBe('supports');
    expect(out.readings[3]!.expected).toBe('OL'); // the healthy part alone
    expect(out.readings[3]!.verdict).not.toBe('ok');
  }, 120_000);

  it('C10 alone reading OL clears C10: the short is elsewhere on VFAN', () => {
    const best = top([...dead, alone('OL')]);
    expect(best.faults.some((f) => f.part === 'C10')).toBe(false);
  }, 120_000);

  it('refuses a part measured alone that is not lifted, a powered reading, and a probe off its pins', () => {
    expect(() => d.update([{ ...alone(2), lifted: [] }])).toThrow(/only when it is lifted/);
    expect(() => d.update([{ ...alone(2), mode: 'dcv', power: 'on', value: 1 }])).toThrow(/unpowered/);
    expect(() => d.update([{ ...alone(2), red: 'v15' }])).toThrow(/v15 is not a pin of C10/);
  });
});
