// The profile the engine is given for the bench's meter: what a shop would enter from the meter's manual. For the
// constant-current handheld that is its ranges with their test currents and open-circuit (compliance) voltages,
// its diode-test current and its stated accuracy per function (the values of meter.ts; the compliance on each
// range is where the bench meter's clamp diode sits at that range's current). `--meter thevenin` puts the
// Thevenin sources of meter.ts in the deck, and the engine is told those.
import { meterProfile, VT, type MeterProfile, type MeterRange } from '@splitscope/circuit';
import { at } from './deck';
import { METER, THEVENIN, type MeterStyle, type Range } from './meter';

// meter.ts's clamp: a diode with IS = 1e-30 A across the probes (Ω), on a 2 V source for the diode test.
const clampAt = (current: number) => VT * Math.log(current / 1e-30);
const accuracy = (r: Range) => ({ pct: r.pct, digits: r.digits });

export function engineMeter(style: MeterStyle = 'constant-current'): MeterProfile {
  const { ohm, continuity, diode } = THEVENIN;
  const base = {
    threshold: METER.continuityThreshold,
    overRange: at(METER.ohm, 0).full,
  };
  if (style === 'thevenin') {
    return meterProfile({
      dcv: { inputResistance: METER.dcvInput },
      ohm: { openCircuitVoltage: ohm.voc, sourceResistance: ohm.rs, overRange: at(METER.ohm, METER.ohm.length - 1).full },
      diode: { openCircuitVoltage: diode.voc, sourceResistance: diode.rs, overRange: METER.diode.full },
      continuity: { ...base, openCircuitVoltage: continuity.voc, sourceResistance: continuity.rs },
    });
  }
  const ranges: MeterRange[] = METER.ohm.map((r) => ({
    full: r.full,
    resolution: r.resolution,
    accuracy: accuracy(r),
    source: { kind: 'current', current: r.current!, compliance: clampAt(r.current!) },
  }));
  const lowest = at(METER.ohm, 0);
  return meterProfile({
    dcv: {
      inputResistance: METER.dcvInput,
      ranges: METER.dcv.map((r) => ({ full: r.full, resolution: r.resolution, accuracy: accuracy(r) })),
      accuracy: accuracy(at(METER.dcv, 0)),
    },
    ohm: { overRange: at(METER.ohm, METER.ohm.length - 1).full, ranges, accuracy: accuracy(lowest) },
    diode: {
      overRange: METER.diode.full,
      source: { kind: 'current', current: METER.diode.current!, compliance: 2 + clampAt(METER.diode.current!) },
      resolution: METER.diode.resolution,
      accuracy: accuracy(METER.diode),
    },
    continuity: { ...base, source: { kind: 'current', current: lowest.current!, compliance: clampAt(lowest.current!) } },
  });
}
