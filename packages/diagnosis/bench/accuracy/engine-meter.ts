// The profile the engine is given for the bench's meter: the closest the engine's meter model takes (what a shop
// would enter from the meter's manual). Its test sources are Thevenin sources, the bench meter's are constant
// currents, so readings through junctions are where the two may disagree; that disagreement is part of what the
// bench measures (`--meter thevenin` takes it away).
import { meterProfile, type MeterProfile } from '@splitscope/circuit';
import { at } from './deck';
import { METER, THEVENIN } from './meter';

export function engineMeter(): MeterProfile {
  const { ohm, continuity, diode } = THEVENIN;
  return meterProfile({
    dcv: { inputResistance: METER.dcvInput },
    ohm: { openCircuitVoltage: ohm.voc, sourceResistance: ohm.rs, overRange: at(METER.ohm, METER.ohm.length - 1).full },
    diode: { openCircuitVoltage: diode.voc, sourceResistance: diode.rs, overRange: METER.diode.full },
    continuity: {
      threshold: METER.continuityThreshold,
      overRange: at(METER.ohm, 0).full,
      openCircuitVoltage: continuity.voc,
      sourceResistance: continuity.rs,
    },
  });
}
