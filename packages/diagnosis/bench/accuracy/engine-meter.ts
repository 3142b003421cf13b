// The profile the engine is given for the bench's meter: the closest the engine's meter model takes. Its ohmmeter
// is a Thevenin source, the bench meter a constant current per range, so resistance through junctions is where
// the two may disagree; that disagreement is part of what the bench measures.
import { meterProfile, type MeterProfile } from '@splitscope/circuit';
import { at } from './deck';
import { METER } from './meter';

export function engineMeter(): MeterProfile {
  const lowest = at(METER.ohm, 0);
  const compliance = 1.5; // the bench clamp's voltage near 0.5 mA
  return meterProfile({
    dcv: { inputResistance: METER.dcvInput },
    ohm: { overRange: at(METER.ohm, METER.ohm.length - 1).full },
    diode: { openCircuitVoltage: 3.5, sourceResistance: (3.5 - 0.6) / METER.diode.current!, overRange: METER.diode.full },
    continuity: {
      threshold: METER.continuityThreshold,
      overRange: lowest.full,
      openCircuitVoltage: compliance,
      sourceResistance: compliance / lowest.current!,
    },
  });
}
