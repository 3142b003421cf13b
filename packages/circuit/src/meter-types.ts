// What a meter is to the solver: its functions, ranges, test sources and stated accuracy, and the default meter.
export type MeterMode = 'dcv' | 'ohm' | 'diode' | 'continuity';

export interface Probe {
  mode: MeterMode;
  red: string;
  black: string;
}

export interface BoardState {
  power: 'on' | 'off';
  /** Top-level part names removed from the board for this reading. */
  lifted?: string[];
  /** Parameter overrides, e.g. { FAN_ON: 0 }. */
  params?: Record<string, number>;
}

export interface Reading {
  value: number | 'OL';
  unit: 'V' | 'ohm';
  beep?: boolean;
}

/**
 * A meter's test source on one range: a Thevenin source (open-circuit voltage behind a resistance: an analog
 * ohmmeter's battery and scale resistor) or a constant current with a compliance voltage (a digital meter's
 * regulated test current, which stops rising at about `compliance` volts on an open circuit).
 */
export type TestSource = { kind: 'thevenin'; voc: number; rs: number } | { kind: 'current'; current: number; compliance: number };

/**
 * A meter's stated accuracy on a function. `pct` + `digits`: a digital meter's ±(% of reading + digits), one digit
 * being the range's resolution. `fullScalePct`: an analog meter's ±% of full scale (DC V). `arcPct`: an analog
 * ohmmeter's ±% of scale arc, which in ohms is arcPct·(R + Rc)²/Rc with Rc the range's centre value (the
 * deflection of a series ohmmeter is Rc/(R + Rc); Kularatna / common practice).
 */
export type Accuracy = { pct: number; digits: number } | { fullScalePct: number } | { arcPct: number };

/** One range of an autoranging (or range-switched) function. */
export interface MeterRange {
  /** Largest value the range shows; above it the range is overloaded. */
  full: number;
  /** One digit (or the smallest division read on an analog scale). */
  resolution: number;
  /** Ω ranges: the range's test source. */
  source?: TestSource;
  /** DC V ranges of an analog meter: input resistance on this range (ohm-per-volt × full scale). */
  inputResistance?: number;
  /** Overrides the function's accuracy on this range. */
  accuracy?: Accuracy;
}

/**
 * How the meter drives the circuit and how far its display can be trusted. The single-range fields
 * (`openCircuitVoltage`, `sourceResistance`, `overRange`) describe a Thevenin meter and are what DEFAULT_METER
 * uses; a profile with `ranges` autoranges over them instead (measure below) and states its accuracy.
 */
export interface MeterProfile {
  /** Short id stored with a job (e.g. "cc-autorange-6000"), and the name shown in the shop. */
  id?: string;
  name?: string;
  /** Where the values come from: a manual named, or "from memory". */
  reference?: string;
  dcv: {
    /** Input resistance between the probes, ohm (typical 10 MΩ; Infinity = ideal voltmeter). */
    inputResistance: number;
    ranges?: MeterRange[];
    accuracy?: Accuracy;
  };
  ohm: {
    /** Open-circuit test voltage, V (typical 0.5–1 V; low enough to leave most silicon junctions off). */
    openCircuitVoltage: number;
    /** Source resistance of the test source, ohm: short-circuit current = openCircuitVoltage / this. */
    sourceResistance: number;
    /** Largest value shown; above it the meter reads OL (typical 40–60 MΩ full scale). */
    overRange: number;
    /** Ranges from the lowest up, each with its test source: the meter autoranges (measure). */
    ranges?: MeterRange[];
    accuracy?: Accuracy;
  };
  diode: {
    /** Open-circuit (compliance) voltage, V (typical 2.5–3.3 V). */
    openCircuitVoltage: number;
    /** Source resistance, ohm: chosen for ≈1 mA into a 0.6 V junction (typical test current 0.5–1.5 mA). */
    sourceResistance: number;
    /** Readings above this show OL, V (typical ≈2 V). */
    overRange: number;
    /** The test source when it is not the Thevenin source above (a constant test current). */
    source?: TestSource;
    resolution?: number;
    accuracy?: Accuracy;
  };
  continuity: {
    /** Beeps below this resistance, ohm (typical 10–100 Ω; 50 Ω chosen here). */
    threshold: number;
    /** Readings above this show OL, ohm (typical range full scale ≈ 600 Ω). */
    overRange: number;
    openCircuitVoltage: number;
    sourceResistance: number;
    /** The test source when it is not the Thevenin source above. */
    source?: TestSource;
  };
}

/** Default meter: typical values from memory, see MeterProfile (a single-range Thevenin meter, no stated accuracy). */
export const DEFAULT_METER: MeterProfile = {
  dcv: { inputResistance: 10e6 },
  ohm: { openCircuitVoltage: 0.5, sourceResistance: 10e3, overRange: 40e6 },
  diode: { openCircuitVoltage: 3.0, sourceResistance: 2.4e3, overRange: 2.0 },
  continuity: { threshold: 50, overRange: 600, openCircuitVoltage: 0.5, sourceResistance: 1e3 },
};

/** A reading the meter must not take in the given context, or a probe on an unknown net. */
export class MeasurementError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MeasurementError';
  }
}

/** Merges a partial profile over the defaults. */
export function meterProfile(overrides: { [K in keyof MeterProfile]?: Partial<MeterProfile[K]> } = {}): MeterProfile {
  return {
    dcv: { ...DEFAULT_METER.dcv, ...overrides.dcv },
    ohm: { ...DEFAULT_METER.ohm, ...overrides.ohm },
    diode: { ...DEFAULT_METER.diode, ...overrides.diode },
    continuity: { ...DEFAULT_METER.continuity, ...overrides.continuity },
  };
}
