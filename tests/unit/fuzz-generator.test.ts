// The fuzzer's generator reaches the valid space (issue hole 13): well-formed payloads drawn from a contract schema
// pass that schema, patterned strings included, and the bench routes' bodies name probe places the board has.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import { createQuoteRequest, createReadingRequest, createReferenceSetRequest, createRepairRequest, type BoardDetail } from '@splitscope/contract';
import { benchValid } from '../../scripts/proof/fuzz-bodies';
import { validArb } from '../../scripts/proof/zod-arb';

type Row = BoardDetail['expectedReadings'][number];
const row = (id: string, mode: Row['mode'], red: string, power: Row['power'], lifted: string[] = []): Row =>
  ({ id, mode, red, black: '0', power, lifted, expected: 1, low: 0.9, high: 1.1, unit: mode === 'dcv' || mode === 'diode' ? 'V' : 'ohm' }) as Row;
// A few rows of the demo outdoor board's expected table, one per meter function and power state.
const board = {
  document: OUTDOOR_FAN_BOARD,
  expectedReadings: [
    row('a', 'dcv', 'TP1', 'on'),
    row('b', 'ohm', 'TP1', 'off'),
    row('c', 'diode', 'TP5', 'off'),
    row('d', 'continuity', 'TP2', 'off', ['C10']),
  ],
} as unknown as BoardDetail;
const points = new Set(OUTDOOR_FAN_BOARD.testPoints.map((t) => t.id));
const sample = (arb: fc.Arbitrary<unknown>) => fc.sample(arb, { numRuns: 200, seed: 7 });

describe('the fuzzer generator', () => {
  it('draws quote lines that pass the contract, quantity pattern included', () => {
    const ok = sample(validArb(createQuoteRequest, 0, {})).filter((v) => createQuoteRequest.safeParse(v).success);
    expect(ok.length).toBeGreaterThan(180);
  });

  it('draws readings on the board’s own test points, with the discharge check when unpowered', () => {
    const bodies = sample(benchValid('POST /api/jobs/:id/readings', createReadingRequest, {}, board, 'a@b.test')!) as Record<string, unknown>[];
    for (const b of bodies) {
      expect(createReadingRequest.safeParse(b).success, JSON.stringify(b)).toBe(true);
      expect(points.has(b.red as string)).toBe(true);
      expect(b.safetyCheck !== undefined).toBe(b.power === 'off');
    }
  });

  it('draws reference sets and repairs the contract accepts, naming the board’s points and parts', () => {
    const sets = sample(benchValid('POST /api/boards/:id/references', createReferenceSetRequest, {}, board, 'a@b.test')!);
    for (const s of sets) {
      expect(createReferenceSetRequest.safeParse(s).success, JSON.stringify(s)).toBe(true);
      for (const r of (s as { readings: { red: string; mode: string }[] }).readings) expect(points.has(r.red) && r.mode !== 'continuity').toBe(true);
    }
    const parts = new Set(OUTDOOR_FAN_BOARD.parts.map((p) => p.designator));
    for (const r of sample(benchValid('POST /api/jobs/:id/repairs', createRepairRequest, {}, board, 'a@b.test')!)) {
      expect(createRepairRequest.safeParse(r).success, JSON.stringify(r)).toBe(true);
      expect(parts.has((r as { part: string }).part)).toBe(true);
    }
  });
});
