/**
 * Bus safety: stored energy and bleed-down time of a charged capacitor.
 *
 * E = ½·C·V², V(t) = V0·e^(−t/RC), t = RC·ln(V0/Vsafe) — the RC discharge law (any circuits textbook,
 * e.g. Alexander & Sadiku, Fundamentals of Electric Circuits, ch. 7 "source-free RC circuit").
 * The checks in the tests use the worked examples of TT electronics/Welwyn "Design Tool #4" (Oxley 2005)
 * and a published resistor-calculator example (10 kΩ, 470 µF).
 */

export type SourceFlag = 'read' | 'secondary' | 'memory';

export interface SafeThreshold {
  id: string;
  /** Voltage treated as "safe to touch" for the bleed-time calculation, in volts d.c. */
  volts: number;
  standard: string;
  clause: string;
  /** How the value was taken: read from the standard, from a page quoting it, or from memory. */
  flag: SourceFlag;
  note: string;
}

/**
 * Thresholds a shop may pick. The default is the SELV d.c. limit. Clause numbers marked "from memory" have not been
 * checked against the standard's text.
 */
export const SAFE_THRESHOLDS = {
  'selv-60vdc': {
    id: 'selv-60vdc',
    volts: 60,
    standard: 'IEC 60950-1',
    clause: 'SELV circuit limits, 60 V d.c. (sub-clause 2.2; clause number from memory)',
    flag: 'secondary',
    note: 'SELV limit of 60 V d.c. under normal conditions (value from a page quoting IEC 60950-1).',
  },
  'es1-60vdc': {
    id: 'es1-60vdc',
    volts: 60,
    standard: 'IEC 62368-1',
    clause: 'ES1 voltage limit, 60 V d.c. (table of ES1 limits; from memory)',
    flag: 'memory',
    note: 'Electrical energy source class 1 d.c. limit, from memory — confirm against the standard before relying on it.',
  },
  'elv-120vdc': {
    id: 'elv-120vdc',
    volts: 120,
    standard: 'IEC 61140',
    clause: 'extra-low voltage band, ≤ 120 V ripple-free d.c.',
    flag: 'secondary',
    note: 'Upper limit of extra-low voltage for ripple-free d.c.; higher than SELV, so it gives shorter waits.',
  },
  'appliance-34v': {
    id: 'appliance-34v',
    volts: 34,
    standard: 'IEC 60335-1',
    clause: 'cl. 22.5 (≤ 34 V between plug pins 1 s after unplugging)',
    flag: 'read',
    note: 'Appliance plug-pin discharge limit; the most cautious of the listed thresholds.',
  },
  'nfpa70e-50v': {
    id: 'nfpa70e-50v',
    volts: 50,
    standard: 'NFPA 70E',
    clause: '50 V shock-hazard threshold (from memory)',
    flag: 'memory',
    note: 'Shock-hazard threshold used in US electrical safety practice, from memory.',
  },
} as const satisfies Record<string, SafeThreshold>;

export type SafeThresholdId = keyof typeof SAFE_THRESHOLDS;
export const DEFAULT_SAFE_THRESHOLD: SafeThreshold = SAFE_THRESHOLDS['selv-60vdc'];

function positive(name: string, v: number): void {
  if (!Number.isFinite(v) || v <= 0) throw new RangeError(`${name} must be a positive number, got ${v}`);
}

/** Energy stored in a capacitor, E = ½·C·V² (joules). */
export function storedEnergy(capacitanceF: number, volts: number): number {
  positive('capacitance', capacitanceF);
  if (!Number.isFinite(volts)) throw new RangeError(`voltage must be finite, got ${volts}`);
  return 0.5 * capacitanceF * volts * volts;
}

/** τ = R·C (seconds). */
export function timeConstant(ohms: number, capacitanceF: number): number {
  positive('resistance', ohms);
  positive('capacitance', capacitanceF);
  return ohms * capacitanceF;
}

/** Capacitor voltage after t seconds of discharge through R: V(t) = V0·e^(−t/RC). */
export function voltageAfter(v0: number, ohms: number, capacitanceF: number, seconds: number): number {
  if (seconds < 0) throw new RangeError('time must not be negative');
  return v0 * Math.exp(-seconds / timeConstant(ohms, capacitanceF));
}

/** Time to bleed from V0 down to Vsafe through R: t = RC·ln(V0/Vsafe) (seconds); 0 when V0 ≤ Vsafe already. */
export function bleedTime(ohms: number, capacitanceF: number, v0: number, vSafe: number): number {
  positive('safe voltage', vSafe);
  const tau = timeConstant(ohms, capacitanceF);
  const a = Math.abs(v0);
  return a <= vSafe ? 0 : tau * Math.log(a / vSafe);
}

export const BUS_CAUTIONS: readonly string[] = [
  'Lethal voltage: an inverter board rectifies mains to a DC bus of about 300–400 V, and its bulk capacitors hold that charge after the plug is pulled.',
  'The hot side (everything referenced to bus negative) is not isolated from mains. Never clip a mains-earthed instrument to it; use an isolation transformer for powered work.',
  'Before any unpowered test: unplug, wait the bleed time shown, then measure the bus with a meter rated for the voltage (CAT rating to suit) and confirm it is below the safe threshold before touching. A failed bleeder means the wait is not enough.',
  'Discharge through a suitably rated resistor, never by shorting the terminals.',
  'These figures are a bench aid only. Follow your local electrical codes, the manufacturer’s service instructions and licensed practice; work on mains-connected equipment only if you are qualified to.',
];

export interface BusSafetyInput {
  capacitanceF: number;
  /** Bleeder resistance across the bus; undefined or Infinity when there is none (no bleed path). */
  bleederOhms?: number;
  /** Starting bus voltage, e.g. the highest healthy bus voltage. */
  busVolts: number;
  threshold?: SafeThreshold;
}

export interface BusSafety {
  energyJ: number;
  /** Energy still stored at the safe threshold. */
  energyAtSafeJ: number;
  tauS: number | null;
  /** Time to reach the threshold; null when there is no bleeder (the bus may hold its charge indefinitely). */
  bleedTimeS: number | null;
  threshold: SafeThreshold;
  cautions: readonly string[];
  summary: string;
}

function fmtTime(s: number): string {
  if (s < 1) return `${(s * 1000).toPrecision(3)} ms`;
  if (s < 120) return `${s.toPrecision(3)} s`;
  return `${(s / 60).toPrecision(3)} min`;
}

/** What the UI shows before an unpowered test on a section that touches the bus. */
export function busSafety(input: BusSafetyInput): BusSafety {
  const threshold = input.threshold ?? DEFAULT_SAFE_THRESHOLD;
  const energyJ = storedEnergy(input.capacitanceF, input.busVolts);
  const energyAtSafeJ = storedEnergy(input.capacitanceF, Math.min(Math.abs(input.busVolts), threshold.volts));
  const r = input.bleederOhms;
  const hasBleeder = r !== undefined && Number.isFinite(r) && r > 0;
  const tauS = hasBleeder ? timeConstant(r, input.capacitanceF) : null;
  const bleedTimeS = hasBleeder ? bleedTime(r, input.capacitanceF, input.busVolts, threshold.volts) : null;
  const summary = hasBleeder
    ? `${input.busVolts.toFixed(0)} V on ${(input.capacitanceF * 1e6).toPrecision(3)} µF stores ${energyJ.toPrecision(3)} J; ` +
      `through ${r} Ω it takes ${fmtTime(bleedTimeS ?? 0)} to fall below ${threshold.volts} V (${threshold.standard}). Measure before touching.`
    : `${input.busVolts.toFixed(0)} V on ${(input.capacitanceF * 1e6).toPrecision(3)} µF stores ${energyJ.toPrecision(3)} J and there is no bleed path: ` +
      `discharge it through a rated resistor and measure below ${threshold.volts} V (${threshold.standard}) before touching.`;
  return { energyJ, energyAtSafeJ, tauS, bleedTimeS, threshold, cautions: BUS_CAUTIONS, summary };
}
