/**
 * Known-good references as evidence for "ok" where the model gives no value (electrical/references.ts): a DC V on
 * a mains net is not modelled (README, "Hazards"), so a reading there is left out of scoring; when it lies within
 * the band measured on known-good boards, the parts on that net take REFERENCE_OK_FACTOR on their odds, and the
 * output says so. Invented small board.
 */
import { describe, expect, it } from 'vitest';
import { createDiagnoser, oddsUpdate, REFERENCE_OK_FACTOR, type CaseReading } from '../src/index.js';

// Mains-side fuse resistor RF into the bus; a divider on the bus.
const NETLIST = ['* invented: mains into a bus through a fuse resistor', 'V1 ac 0 DC 310', 'RF ac bus 2.2', 'R1 bus mid 100k', 'R2 mid 0 10k', '.end'].join(
  '\n',
);
const board = {
  netlist: NETLIST,
  acMains: ['ac'],
  testPoints: [
    { id: 'TP1', label: 'Mains in', net: 'ac', ref: '0' },
    { id: 'TP2', label: 'Divider', net: 'mid', ref: '0' },
  ],
};
const mains: CaseReading = { mode: 'dcv', red: 'ac', black: '0', power: 'on', value: 311 };
const band = { mode: 'dcv' as const, red: 'ac', black: '0', power: 'on' as const, low: 300, high: 322, boards: 3 };

describe('references where the model is silent', () => {
  const d = createDiagnoser(board);

  it('the model gives no value for the reading, and without references nothing moves', () => {
    const out = d.update([mains]);
    expect(out.readings[0]?.expected).toBeNull();
    expect(out.priors).toEqual([]);
    // The first update builds the board's predictions (seconds on a loaded machine).
  }, 120_000);

  it('within the known-good band: the parts on the net are likelier sound, and the output says why', () => {
    const out = d.update([mains], { references: [band] });
    const rf = out.priors.filter((p) => p.part === 'RF');
    expect(rf.length).toBeGreaterThan(0);
    for (const p of rf) {
      expect(p.after).toBeCloseTo(oddsUpdate(p.before, REFERENCE_OK_FACTOR), 12);
      expect(p.steps[0]?.source).toBe('reference');
      expect(p.steps[0]?.note).toBe(
        'TP1 DC V 311 V is within 3 known-good boards (300 V – 322 V) where the model gives no value: the parts on it are likelier sound',
      );
    }
    // R1 has no pin on the mains net: untouched.
    expect(out.priors.some((p) => p.part === 'R1')).toBe(false);
  });

  it('outside the band, or from one board only, the references say nothing', () => {
    expect(d.update([{ ...mains, value: 250 }], { references: [band] }).priors).toEqual([]);
    expect(d.update([mains], { references: [{ ...band, boards: 1 }] }).priors).toEqual([]);
  });
});
