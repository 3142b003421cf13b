/**
 * The meter profiles Splitscope ships, and the accuracy of a reading under a profile.
 *
 * No manual was at hand when these were written: every value is from memory, typical of its class of meter, and
 * each profile says so in `reference`. A shop that owns a meter enters its own values from the meter's manual.
 */
import type { Accuracy, MeterMode, MeterProfile, MeterRange, TestSource } from './meter-types';

const cc = (current: number, compliance: number): TestSource => ({ kind: 'current', current, compliance });
const th = (voc: number, rs: number): TestSource => ({ kind: 'thevenin', voc, rs });

/**
 * A 6000-count autoranging handheld (from memory, typical of the class): DC V 600 mV–1000 V into 10 MΩ,
 * ±(0.5 % + 3 digits); Ω by a constant test current per range (0.5 mA on 600 Ω down to 10 nA on 60 MΩ, so a full-scale
 * reading drops 0.3 V, 0.6 V on 60 MΩ), compliance ≈1.5 V, ±(1.0 % + 5 digits), 60 MΩ ±(2.0 % + 10 digits); diode
 * test 0.8 mA, compliance 3.2 V, shows OL above 3.000 V, ±(1.5 % + 3 digits); continuity beeps below 30 Ω on the
 * 600 Ω range's current.
 */
export const CC_AUTORANGE_6000: MeterProfile = {
  id: 'cc-autorange-6000',
  name: 'Autoranging handheld, 6000 counts, constant-current Ω',
  reference: 'from memory: typical 6000-count autoranging handheld (no manual named)',
  dcv: {
    inputResistance: 10e6,
    ranges: [
      { full: 0.5999, resolution: 1e-4 },
      { full: 5.999, resolution: 1e-3 },
      { full: 59.99, resolution: 1e-2 },
      { full: 599.9, resolution: 0.1 },
      { full: 1000, resolution: 1, accuracy: { pct: 0.8, digits: 3 } },
    ],
    accuracy: { pct: 0.5, digits: 3 },
  },
  ohm: {
    openCircuitVoltage: 1.5,
    sourceResistance: 1.5 / 5e-4,
    overRange: 59.99e6,
    ranges: [
      { full: 599.9, resolution: 0.1, source: cc(5e-4, 1.5) },
      { full: 5999, resolution: 1, source: cc(5e-5, 1.5) },
      { full: 59.99e3, resolution: 10, source: cc(5e-6, 1.5) },
      { full: 599.9e3, resolution: 100, source: cc(5e-7, 1.5) },
      { full: 5.999e6, resolution: 1e3, source: cc(5e-8, 1.5) },
      { full: 59.99e6, resolution: 1e4, source: cc(1e-8, 1.5), accuracy: { pct: 2.0, digits: 10 } },
    ],
    accuracy: { pct: 1.0, digits: 5 },
  },
  diode: { openCircuitVoltage: 3.2, sourceResistance: 3.2 / 8e-4, overRange: 3.0, source: cc(8e-4, 3.2), resolution: 1e-3, accuracy: { pct: 1.5, digits: 3 } },
  continuity: { threshold: 30, overRange: 599.9, openCircuitVoltage: 1.5, sourceResistance: 1.5 / 5e-4 },
};

/**
 * Ohm ranges of a series ohmmeter: centre value Rc = the range's source resistance. A technician switches up once
 * the needle passes about 3 × Rc, so each range is read between Rc/3 and 3·Rc; the top range reads on to 100 × Rc
 * (common practice; from memory).
 */
const analogOhm = (rc: number, voc: number, upTo = 3): MeterRange => ({ full: upTo * rc, resolution: rc / 20, source: th(voc, rc) });

/**
 * An analog-style multimeter with 20 kΩ/V on DC V (from memory, typical of the class): DC V ranges 2.5, 10, 50,
 * 250, 1000 V, input resistance 20 kΩ/V × range, ±3 % of full scale; Ω ×1, ×10, ×100, ×1k from a 1.5 V cell with
 * centre values 20 Ω … 20 kΩ and ×10k from a 9 V battery (centre 200 kΩ, read to 20 MΩ), ±3 % of arc; the diode check is the
 * ×10 range read on its LV scale (1.5 V behind 200 Ω; full scale 1.5 V, shown OL above 1.4 V), ±3 % of full
 * scale; the continuity buzzer sounds below 20 Ω on the ×1 range.
 */
export const ANALOG_THEVENIN_20K: MeterProfile = {
  id: 'analog-thevenin-20k',
  name: 'Analog-style multimeter, 20 kΩ/V, Thevenin Ω',
  reference: 'from memory: typical 20 kΩ/V analog multimeter (no manual named)',
  dcv: {
    inputResistance: 20e6,
    ranges: [2.5, 10, 50, 250, 1000].map((full) => ({ full, resolution: full / 50, inputResistance: 20e3 * full })),
    accuracy: { fullScalePct: 3 },
  },
  ohm: {
    openCircuitVoltage: 1.5,
    sourceResistance: 20,
    overRange: 20e6,
    ranges: [analogOhm(20, 1.5), analogOhm(200, 1.5), analogOhm(2e3, 1.5), analogOhm(20e3, 1.5), analogOhm(200e3, 9, 100)],
    accuracy: { arcPct: 3 },
  },
  diode: { openCircuitVoltage: 1.5, sourceResistance: 200, overRange: 1.4, resolution: 0.03, accuracy: { fullScalePct: 3 } },
  continuity: { threshold: 20, overRange: 400, openCircuitVoltage: 1.5, sourceResistance: 20 },
};

/** The shipped profiles by id; the first is the default for a shop that has not chosen. */
export const METER_PROFILES: readonly MeterProfile[] = [CC_AUTORANGE_6000, ANALOG_THEVENIN_20K];

/** A shipped profile by id, or undefined. */
export const meterProfileById = (id: string): MeterProfile | undefined => METER_PROFILES.find((p) => p.id === id);

/** The range a value is shown on: the first whose full scale holds it, else the last. */
function rangeOf(ranges: readonly MeterRange[], x: number): MeterRange {
  return ranges.find((r) => Math.abs(x) <= r.full) ?? (ranges[ranges.length - 1] as MeterRange);
}

function limit(acc: Accuracy, x: number, range: { full: number; resolution: number; source?: TestSource }): number {
  if ('pct' in acc) return (acc.pct / 100) * Math.abs(x) + acc.digits * range.resolution;
  if ('fullScalePct' in acc) return (acc.fullScalePct / 100) * range.full;
  // ±arcPct of the scale arc of a series ohmmeter (deflection Rc/(R + Rc)): dR = arc·(R + Rc)²/Rc.
  const rc = range.source?.kind === 'thevenin' ? range.source.rs : range.full / 20;
  return ((acc.arcPct / 100) * (Math.abs(x) + rc) ** 2) / rc;
}

/**
 * The meter's stated accuracy at a reading: the ± limit in the function's units (V or Ω) on the range that value
 * is shown on, or undefined when the profile states none (continuity has no stated accuracy: beep or not).
 */
export function accuracyLimit(meter: MeterProfile, mode: MeterMode, x: number): number | undefined {
  if (mode === 'dcv' || mode === 'ohm') {
    const f = meter[mode];
    if (!f.accuracy || !f.ranges?.length) return undefined;
    const range = rangeOf(f.ranges, x);
    return limit(range.accuracy ?? f.accuracy, x, range);
  }
  if (mode === 'diode') {
    const d = meter.diode;
    if (!d.accuracy) return undefined;
    return limit(d.accuracy, x, { full: d.overRange, resolution: d.resolution ?? 1e-3, ...(d.source ? { source: d.source } : {}) });
  }
  return undefined;
}
