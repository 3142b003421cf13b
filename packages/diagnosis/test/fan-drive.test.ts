/**
 * Fan-drive case on the invented demo board (fixtures/fan-drive.ts): the motor's control supply VFAN, fed by
 * the PNP high-side switch Q1 and filtered by C8 (electrolytic), C9 and C10 (ceramic), reads dead while the
 * 15 V regulator is healthy.
 * Expected reasoning (common practice at the bench): a dead switched rail with a healthy source is either a
 * short on the rail (a filter capacitor) or a switch that does not turn on (switch open, base drive open);
 * an unpowered resistance / continuity check on the rail separates the two; lifting the suspect capacitor
 * confirms it.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { createDiagnoser, type CaseReading, type DiagnosisOutput, type Diagnoser } from '../src/index.js';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive.js';

const dead: CaseReading[] = [
  { mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 14.98 },
  { mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 0.05 },
];
const beep: CaseReading[] = [...dead, { mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: true }];
const lifted: CaseReading[] = [...beep, { mode: 'ohm', red: 'vfan', black: '0', power: 'off', lifted: ['C9'], value: 1310 }];

const name = (c: DiagnosisOutput['candidates'][number]) => c.faults.map((f) => `${f.part}:${f.mode}`).join('+');

let d: Diagnoser;
let out0: DiagnosisOutput;
let out1: DiagnosisOutput;
let out2: DiagnosisOutput;

beforeAll(() => {
  d = createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });
  out0 = d.update(dead);
  out1 = d.update(beep);
  out2 = d.update(lifted);
}, 240_000);

describe('fan-drive case: dead VFAN with a healthy regulator', () => {
  it('reports the readings against the healthy board', () => {
    expect(out0.readings[0]?.verdict).toBe('ok');
    expect(out0.readings[1]?.verdict).toBe('low');
    expect(out0.readings[1]?.expected).toBeGreaterThan(14);
    expect(out0.readings[1]?.low).toBeLessThan(out0.readings[1]?.expected as number);
  });

  it('candidates include each filter capacitor shorted, the base drive open and the switch open', () => {
    const top = out0.candidates.slice(0, 25).map(name);
    for (const c of ['C8:short', 'C9:short', 'C10:short', 'R7:open', 'R6:open', 'XU1:dl:open', 'Q1:be-open']) expect(top).toContain(c);
    // The healthy board and the regulator explain nothing.
    const none = out0.candidates.find((c) => c.faults.length === 0);
    expect(none?.probability ?? 0).toBeLessThan(1e-3);
    const regDead = out0.parts.find((p) => p.part === 'XVREG' || p.part === 'XVREG.q1');
    expect(regDead?.probability ?? 0).toBeLessThan(0.01);
  });

  it('probabilities are a distribution and parts are marginals', () => {
    for (const o of [out0, out1, out2]) {
      const s = o.candidates.reduce((a, c) => a + c.probability, 0) + o.restProbability + o.unmodelledProbability;
      expect(s).toBeCloseTo(1, 9);
      for (let i = 1; i < o.candidates.length; i++) expect(o.candidates[i - 1]!.probability).toBeGreaterThanOrEqual(o.candidates[i]!.probability);
    }
    const c9 = out0.parts.find((p) => p.part === 'C9' && p.mode === 'short')!;
    const sum = out0.candidates.filter((c) => c.faults.some((f) => f.part === 'C9' && f.mode === 'short')).reduce((a, c) => a + c.probability, 0);
    // Marginals run over every scored candidate; the listed ones miss at most the rest's mass.
    expect(c9.probability).toBeGreaterThanOrEqual(sum - 1e-12);
    expect(c9.probability - sum).toBeLessThanOrEqual(out0.restProbability + 1e-12);
  });

  it('evidence: the dead-rail reading supports a capacitor short and speaks for it against no fault', () => {
    const c9 = out0.candidates.find((c) => name(c) === 'C9:short')!;
    expect(c9.evidence[1]?.effect).toBe('supports');
    expect(c9.evidence[1]!.llr).toBeGreaterThan(5);
  });

  it('an unpowered resistance or continuity test on the rail ranks among the first next tests', () => {
    const idx = out0.nextTests.findIndex((t) => t.red === 'vfan' && t.black === '0' && (t.mode === 'ohm' || t.mode === 'continuity') && t.power === 'off');
    expect(idx).toBeGreaterThanOrEqual(0);
    expect(idx).toBeLessThan(10);
    const t = out0.nextTests[idx]!;
    expect(t.instruction).toMatch(/^Unplug the board and confirm the bus is discharged, then put the red probe on TP5 and the black on C1 −/);
    expect(t.cost).toBeGreaterThan(1);
  });

  // D3, the clamp diode across the rail, shorted is the capacitors' twin at DC: capacitors and diodes weigh a short
  // on one grid (kinds.ts SHORT_GRID), so the rail's shorts lead as a family.
  const RAIL_SHORTS = ['C10:short', 'C8:short', 'C9:short', 'D3:short'];

  it('after a continuity beep on the rail the shorts across it (C8, C9, C10, D3) lead', () => {
    const top3 = out1.candidates.slice(0, 3).map(name);
    expect(top3.every((n) => RAIL_SHORTS.includes(n))).toBe(true);
    const capMass = out1.parts.filter((p) => ['C8', 'C9', 'C10', 'D3'].includes(p.part) && p.mode === 'short').reduce((a, p) => a + p.probability, 0);
    expect(capMass).toBeGreaterThan(0.8);
    // Lifting a capacitor is now among the suggested next tests.
    expect(out1.nextTests.some((t) => t.lifted.length > 0 && /^Lift C(8|9|10) with the iron/.test(t.instruction))).toBe(true);
  });

  it('after lifting C9 the rail reads healthy and C9 short takes probability above 0.9', () => {
    expect(out2.readings[3]?.verdict).toBe('ok');
    expect(name(out2.candidates[0]!)).toBe('C9:short');
    expect(out2.candidates[0]!.probability).toBeGreaterThan(0.9);
    expect(out2.minimalDiagnoses[0]).toEqual(['C9']);
  });

  it('predictions are cached: a repeated update re-simulates nothing', () => {
    const before = d.model.solves;
    const again = d.update(lifted);
    expect(d.model.solves).toBe(before);
    expect(again.candidates[0]!.probability).toBeCloseTo(out2.candidates[0]!.probability, 12);
  });

  it('a realistic partial short (rail at a few hundred millivolts) keeps the capacitor shorts on top', () => {
    const out = d.update([dead[0]!, { ...dead[1]!, value: 0.35 }, beep[2]!]);
    const top3 = out.candidates.slice(0, 3).map(name);
    expect(top3.every((n) => RAIL_SHORTS.includes(n))).toBe(true);
  }, 300_000);

  it('one odd reading does not wipe out the right candidate', () => {
    // A slipped probe: V15 read as 9 V although the regulator is fine.
    const odd: CaseReading[] = [{ ...dead[0]!, value: 9 }, ...lifted.slice(1)];
    const out = d.update(odd);
    const c9 = out.parts.find((p) => p.part === 'C9' && p.mode === 'short');
    expect(c9?.probability ?? 0).toBeGreaterThan(0.5);
  }, 300_000);
});
