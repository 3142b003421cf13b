/**
 * A board's fault dictionary holds predictions read with the board's own meter (docs/decisions/0005): a diagnosis
 * asked for with another meter profile must not read them, since a junction Ω or a loaded DC V reading depends on
 * the meter's test current and input resistance (packages/circuit meter.ts; profile values from memory). It solves
 * on demand instead, and gives what a diagnoser that never had a dictionary gives for that meter.
 */
import { describe, expect, it } from 'vitest';
import { ANALOG_THEVENIN_20K, CC_AUTORANGE_6000 } from '@splitscope/circuit';
import { attachDictionary, buildDictionary, createDiagnoser, type CaseReading } from '../src/index.js';

// An invented sensing input: a 4.7 kΩ feed from a 12 V rail, a clamp diode to ground and a 470 kΩ bleed.
const NETLIST = `clamped input (invented)
.model dclamp D(IS=4e-9 N=1.9)
DCL a 0 dclamp
RB a 0 470k
RF rail a 4.7k
VCC rail 0 12
.end`;
const POINTS = [{ net: 'a', label: 'TP1' }];
const READINGS: CaseReading[] = [
  { mode: 'ohm', red: 'a', black: '0', power: 'off', value: 150e3 },
  { mode: 'dcv', red: 'a', black: '0', power: 'on', value: 0.52 },
];

describe('fault dictionary and meter profiles', () => {
  const withDictionary = createDiagnoser({ netlist: NETLIST, testPoints: POINTS });
  attachDictionary(withDictionary, buildDictionary(withDictionary));

  it.each([CC_AUTORANGE_6000, ANALOG_THEVENIN_20K])(
    'a diagnosis with the $name profile equals a fresh solve for that meter, not the dictionary',
    (meter) => {
      const fresh = createDiagnoser({ netlist: NETLIST, testPoints: POINTS }).update(READINGS, { meter });
      const out = withDictionary.update(READINGS, { meter });
      expect(out.readings.map((r) => r.expected)).toEqual(fresh.readings.map((r) => r.expected));
      expect(out.candidates.slice(0, 5).map((c) => [c.faults, c.probability.toFixed(6)])).toEqual(
        fresh.candidates.slice(0, 5).map((c) => [c.faults, c.probability.toFixed(6)]),
      );
    },
    120_000,
  );

  it('the board’s own meter reads the dictionary, and its junction Ω differs from the constant-current meter’s', () => {
    const own = withDictionary.update(READINGS).readings[0]!.expected as number;
    const cc = withDictionary.update(READINGS, { meter: CC_AUTORANGE_6000 }).readings[0]!.expected as number;
    expect(withDictionary.cache.source).toBeDefined();
    expect(Math.abs(cc - own) / own).toBeGreaterThan(0.05);
  }, 120_000);
});
