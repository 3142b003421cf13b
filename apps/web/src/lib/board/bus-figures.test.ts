import { describe, expect, it } from 'vitest';
import { OUTDOOR_FAN_BOARD } from '@splitscope/boards';
import type { ExpectedReadingRow } from '@splitscope/contract';
import { boardView } from './board-view';
import { busFigures } from './bus-figures';

const row = (over: Partial<ExpectedReadingRow>): ExpectedReadingRow =>
  ({ id: 'r', mode: 'dcv', red: 'TP1', black: '0', power: 'on', lifted: [], expected: 310, low: 280, high: 340, unit: 'V', ...over }) as ExpectedReadingRow;

describe('bus figures for the safety gate', () => {
  const view = boardView(OUTDOOR_FAN_BOARD);
  it('takes the bleed path from the engine’s unpowered resistance across the bulk capacitor (series bleeders count)', () => {
    const f = busFigures(view, [row({}), row({ id: 'o', mode: 'ohm', power: 'off', expected: 231_000, low: 200_000, high: 260_000, unit: 'ohm' })]);
    expect(f?.bleederOhms).toBe(231_000);
    expect(f?.busVolts).toBe(340);
    expect(f?.capacitor).toMatch(/^C/);
  });
  it('has no bus figures when the table has no powered bus reading', () => {
    expect(busFigures(view, [])).toBeNull();
  });
});
