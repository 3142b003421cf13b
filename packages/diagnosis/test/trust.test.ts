/**
 * Trust on the invented fan-drive demo board (fixtures/fan-drive.ts):
 * - repeats refine, they do not multiply (repeats.ts: Gaussian random-effects model, the mean is sufficient);
 * - next tests never repeat a test already taken unless confirmations are asked for;
 * - "not explained" is an answer (rule in report.ts);
 * - the bench's words: designators, kind words, modes in words, probe points by test point or part pin, and no
 *   simulator-internal name in any sentence (issue 18's patterns).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_METER, MeasurementError, meterProfile } from '@splitscope/circuit';
import {
  createDiagnoser,
  groupLogLikelihood,
  isSolveFailure,
  readingLogLikelihood,
  type CaseReading,
  type DiagnosisOutput,
  type Diagnoser,
} from '../src/index.js';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive.js';

const v15: CaseReading = { mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 14.98 };
const vfan: CaseReading = { mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 0.05 };
const beep: CaseReading = { mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: true };
const INTERNAL = [/\b[a-z]{1,3}\d?:(open|short|ce-short|be-open|drift)\b/, /\bX[A-Z]+\d*\b/];
const key = (t: { mode: string; red: string; black: string; power: string; lifted: string[] }) =>
  `${t.mode}|${t.red}|${t.black}|${t.power}|${t.lifted.join(',')}`;

let d: Diagnoser;
let once: DiagnosisOutput;
let thrice: DiagnosisOutput;

beforeAll(() => {
  d = createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });
  once = d.update([v15, vfan, beep]);
  // VFAN read three times, once from the connector side: the same quantity (same nets, power, nothing lifted).
  thrice = d.update([v15, vfan, beep, { ...vfan, value: 0.06 }, { ...vfan, red: 'VFAN', value: 0.04 }]);
}, 300_000);

describe('repeats are not new evidence', () => {
  it('a group scores as one reading at its mean, meter term shrunk by k (random-effects model)', () => {
    const pred = { value: 15 };
    const one = readingLogLikelihood('dcv', 14.5, pred, DEFAULT_METER);
    const three = groupLogLikelihood('dcv', { repeats: [14.5, 14.5, 14.5] }, pred, DEFAULT_METER);
    // Not 3× one reading: the shared tolerance term stays whole, so the group is about one reading's worth.
    expect(Math.abs(three - one)).toBeLessThan(0.5);
    const far = groupLogLikelihood('dcv', { repeats: [0.05, 0.05, 0.05] }, pred, DEFAULT_METER);
    expect(far).toBeGreaterThan(3 * readingLogLikelihood('dcv', 0.05, pred, DEFAULT_METER));
  });

  it('three readings of VFAN leave the ranking and the probabilities about where one left them', () => {
    const top = (o: DiagnosisOutput) =>
      o.candidates
        .slice(0, 3)
        .map((c) => c.words.text)
        .sort();
    expect(top(thrice)).toEqual(top(once));
    const p = (o: DiagnosisOutput) => o.candidates[0]!.probability;
    expect(Math.abs(p(thrice) - p(once))).toBeLessThan(0.05);
    expect(thrice.readings[3]?.repeatOf).toBe(1);
    expect(thrice.readings[4]?.repeatOf).toBe(1);
    expect(thrice.readings[4]?.note).toMatch(/counted once/);
    // Every reading of a group shows the group's evidence.
    const c = thrice.candidates[0]!;
    expect(c.evidence[3]?.llr).toBe(c.evidence[1]?.llr);
  });

  it('next tests never repeat a test already taken; with confirmations asked, a repeat is flagged', () => {
    for (const o of [once, thrice]) {
      const taken = new Set(o.readings.map((_, i) => i).map((i) => key({ ...[v15, vfan, beep][Math.min(i, 2)]!, lifted: [] } as never)));
      for (const t of o.nextTests) expect(taken.has(key(t))).toBe(false);
    }
    const conf = d.update([v15, vfan, beep], { confirm: true, nextTests: 80 });
    expect(conf.nextTests.every((t) => (t.confirmation === true) === [v15, vfan, beep].some((r) => key({ ...r, lifted: [] } as never) === key(t)))).toBe(true);
  }, 300_000);
});

describe('"not explained" is an answer', () => {
  it('a bus reading nothing modelled produces is named, and "no fault" is not rewarded', () => {
    const out = d.update([{ mode: 'dcv', red: 'bus', black: '0', power: 'on', value: 120 }, v15]);
    expect(out.unexplained).toBeDefined();
    expect(out.unexplained!.readings).toEqual([0]);
    expect(out.unexplained!.message).toMatch(/TP1/);
    expect(out.unexplained!.message).toMatch(/does not cover/);
    expect(out.unmodelledProbability).toBeGreaterThan(0.2);
    const noFault = out.candidates.find((c) => c.faults.length === 0)!;
    expect(noFault.probability).toBeLessThan(0.8);
    expect(out.minimalDiagnoses).toEqual([]);
  }, 300_000);
  it('an explained case carries no such field', () => {
    expect(once.unexplained).toBeUndefined();
    expect(once.unmodelledProbability).toBeLessThan(0.01);
  });
});

describe("the bench's words", () => {
  it('candidates carry designator, kind word and mode in words', () => {
    const texts = once.candidates.slice(0, 30).map((c) => c.words.text);
    expect(texts).toContain('C9 capacitor — shorted');
    expect(texts).toContain('U1 opto — LED open');
    const q1 = once.candidates.find((c) => c.faults.length === 1 && c.faults[0]?.part === 'Q1' && c.faults[0]?.mode === 'be-open');
    expect(q1?.words.text).toBe('Q1 transistor — base–emitter open');
    expect(once.parts.find((p) => p.part === 'XU1' && p.mode === 'dl:open')?.words.text).toBe('U1 opto — LED open');
  });
  it('next tests name probe points by test point or part pin; no internal name in any sentence', () => {
    for (const t of [...once.nextTests, ...thrice.nextTests]) {
      expect(t.probes.red.label).toMatch(/^(TP\d+|[A-Z]+\d+ .+)/);
      expect(t.probes.black.label).toMatch(/^(TP\d+|C1 −)$/);
      for (const re of INTERNAL) expect(t.instruction).not.toMatch(re);
    }
    for (const c of once.candidates) for (const re of INTERNAL) expect(c.words.text).not.toMatch(re);
    expect(once.readings[1]?.function).toBe('DC V');
    expect(once.readings[1]?.probes.red.label).toBe('TP5');
  });
});

describe('failed solves and meter profiles', () => {
  it('a solve failure is recognised by name (SolveError) or, from older circuit packages, by its message', () => {
    const solveError = Object.assign(new Error('the model could not be solved in this state'), { name: 'SolveError' });
    expect(isSolveFailure(solveError)).toBe(true);
    expect(isSolveFailure(new MeasurementError('the circuit does not solve: no convergence'))).toBe(true);
    expect(isSolveFailure(new MeasurementError('unknown net "x" for red'))).toBe(false);
    expect(isSolveFailure(new Error('does not solve'))).toBe(false);
  });

  it('expected values follow the meter profile of the update (a 1 kΩ-input voltmeter loads the 5 kΩ bus-sense divider)', () => {
    const sense: CaseReading = { mode: 'dcv', red: 'bsense', black: '0', power: 'on', value: 1.5 };
    const loading = meterProfile({ dcv: { inputResistance: 1e3 } });
    const a = d.update([sense], { meter: loading, nextTests: 1 });
    const b = d.update([sense], { nextTests: 1 });
    // 310 V × 5.1k/(1M + 5.1k) = 1.573 V; with 1 kΩ across the 5.1 kΩ leg: 310 × 836/(1M + 836) = 0.259 V.
    expect(b.readings[0]!.expected as number).toBeCloseTo(1.573, 2);
    expect(a.readings[0]!.expected as number).toBeCloseTo(0.259, 2);
    // A net without a test point is named by the nearest part pin, never by its net name.
    expect(b.readings[0]!.probes.red.label).toMatch(/^(C2|R3|R4|R34) /);
  }, 300_000);
});
