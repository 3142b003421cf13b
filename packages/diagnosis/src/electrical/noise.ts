/**
 * Noise model of a bench reading given a predicted reading.
 *
 * Each meter mode is scored in the scale in which its errors are roughly Gaussian:
 * - dcv: volts, σ² = σ_meter² + σ_tol², meter (repeatability) ±(0.5 % of reading + 20 mV) (a handheld DMM's
 *   basic DC accuracy and the offset/pickup of probing a live board; from memory), part tolerance 1.5 % of the
 *   value (rails are set by references and dividers of 1–2 % parts; from memory); from 60 V up the mains
 *   tolerance ±10 % as 3σ (MAINS_TOL).
 * - ohm: log space, s = ln(R + r0) with r0 = 0.3 Ω (lead and contact resistance; from memory), so an error is
 *   relative for large values and absolute for a short. σ_meter = 1 %, σ_tol = 8 % for part tolerance plus the
 *   spread of junction paths at the meter's test voltage (from memory).
 * - diode: volts, σ_tol = √(15 mV² + (3 % of the drop)²) (junction spread with temperature and test current;
 *   from memory), σ_meter = 2 mV + 0.5 % (a handheld's diode-test accuracy; from memory).
 * A profile that states its accuracy (MeterProfile.accuracy, ±(% + digits) per range, or an analog meter's % of
 * full scale / of arc) replaces the meter terms above: its ± limit is read as the half-width of a rectangular
 * distribution, σ_meter = limit/√3 (JCGM 100:2008, the GUM, §4.3.7), in volts for dcv and diode and divided by
 * (R + r0) in the log scale of ohm.
 * The two terms are kept apart because they behave differently on repeats (repeats.ts): the part tolerance is
 * one error shared by every reading of the same quantity on one board, the meter term is fresh per reading.
 * The Gaussian core is mixed with a heavy tail: likelihood = (1 - ε)·N(s; μ, σ) + ε·Cauchy(s; μ, γ), ε = 0.02,
 * γ = 5σ + a floor. Reason: a probe slipping onto the wrong pad, a part whose real value sits outside the
 * modelled sweep, or a model simplification must cost a candidate a bounded factor (about ln(ε) plus a log of
 * the distance) rather than zero it, so one odd reading never wipes out the right candidate; several
 * agreeing readings still outweigh it.
 * Discrete outcomes: "OL" against a number is a discrete outcome with confusion δ = 0.01 (an intermittent
 * probe contact reads OL, a reading just under full scale shows a number); near full scale the probability of
 * OL follows the Gaussian in the same scale. Continuity beep / no beep: P(beep) = Φ((ln thr - ln(R + r0)) / 0.15),
 * clamped to [δ, 1 - δ].
 * Consistency (for minimal diagnoses): a reading is within its band when it lies within 3σ of the prediction
 * (and OL / beep agree).
 */
import { accuracyLimit, type MeterProfile } from '@splitscope/circuit';

export type MeterMode = 'dcv' | 'ohm' | 'diode' | 'continuity';
export type ReadingValue = number | 'OL' | boolean;

/** A predicted reading: a number, OL, or a failure to solve (unknown). */
export interface Prediction {
  value: number | 'OL' | 'unknown';
  beep?: boolean;
  /**
   * Why a prediction is unknown: the model does not solve in that state, a DC reading on an AC mains net, or a
   * fault pair still being computed in the background (dictionary.ts).
   */
  reason?: 'no-solve' | 'ac-mains' | 'pending';
}

/** The prediction could be computed (not 'unknown'). */
export const isPredicted = (p: Prediction) => p.value !== 'unknown';

export const EPS_TAIL = 0.02;
export const DELTA_CONFUSION = 0.01;
export const R0 = 0.3;
export const BAND_K = 3;
const SIG_CONT = 0.15;

const LN_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

/** Standard normal CDF (Abramowitz & Stegun 26.2.17 rational approximation, |error| < 7.5e-8). */
export function phi(x: number): number {
  if (x === Infinity) return 1;
  if (x === -Infinity) return 0;
  const t = 1 / (1 + 0.2316419 * Math.abs(x));
  const d = 0.3989422804014327 * Math.exp((-x * x) / 2);
  const p = d * t * (0.31938153 + t * (-0.356563782 + t * (1.781477937 + t * (-1.821255978 + t * 1.330274429))));
  return x > 0 ? 1 - p : p;
}

const clampP = (p: number) => Math.min(1 - DELTA_CONFUSION, Math.max(DELTA_CONFUSION, p));

export interface Scale {
  /** Map a number reading to the scale. */
  s: (x: number) => number;
  /** σ in the scale for a prediction of value μ (raw units): √(σ_meter² + σ_tol²). */
  sigma: (mu: number) => number;
  /** The meter's repeatability part of σ (fresh per reading). */
  sigmaMeter: (mu: number) => number;
  /** The part-tolerance part of σ (shared by repeats of one quantity). */
  sigmaTol: (mu: number) => number;
  /** Cauchy scale floor. */
  gammaFloor: number;
  /** Full scale in raw units (OL above). */
  overRange: number;
}

const scaleMemo = new WeakMap<MeterProfile, Partial<Record<MeterMode, Scale>>>();

export function scaleOf(mode: MeterMode, meter: MeterProfile): Scale {
  let m = scaleMemo.get(meter);
  if (!m) {
    m = {};
    scaleMemo.set(meter, m);
  }
  let sc = m[mode];
  if (!sc) {
    sc = makeScale(mode, meter);
    m[mode] = sc;
  }
  return sc;
}

const LN_R0 = Math.log(R0);
const SIG_OHM_METER = 0.01;
/**
 * From 60 V up (the hazard level, hazard.ts) a DC voltage comes from the mains: its tolerance is the mains'
 * (230 V ±10 % → 293–358 V on the bus, see the references file [computed]), taken as 3σ.
 */
const MAINS_LEVEL = 60;
const MAINS_TOL = 0.1 / 3;
const SIG_OHM_TOL = 0.08;

const SQRT3 = Math.sqrt(3);

/** σ_meter from the profile's stated accuracy (GUM §4.3.7: a ± limit as a rectangular distribution), else `legacy`. */
function stated(mode: MeterMode, meter: MeterProfile, legacy: (mu: number) => number, log = false): (mu: number) => number {
  if (accuracyLimit(meter, mode, 1) === undefined) return legacy;
  return (mu) => {
    const sd = (accuracyLimit(meter, mode, mu) as number) / SQRT3;
    return log ? sd / (Math.max(mu, 0) + R0) : sd;
  };
}

function makeScale(mode: MeterMode, meter: MeterProfile): Scale {
  const split = (sigmaMeter: (mu: number) => number, sigmaTol: (mu: number) => number) => ({
    sigmaMeter,
    sigmaTol,
    sigma: (mu: number) => Math.hypot(sigmaMeter(mu), sigmaTol(mu)),
  });
  switch (mode) {
    case 'dcv':
      return {
        s: (x) => x,
        ...split(
          stated('dcv', meter, (mu) => 0.005 * Math.abs(mu) + 0.02),
          (mu) => (Math.abs(mu) >= MAINS_LEVEL ? MAINS_TOL : 0.015) * Math.abs(mu),
        ),
        gammaFloor: 0.2,
        overRange: Infinity,
      };
    case 'diode':
      return {
        s: (x) => x,
        ...split(
          stated('diode', meter, (mu) => 0.002 + 0.005 * Math.abs(mu)),
          (mu) => Math.hypot(0.015, 0.03 * mu),
        ),
        gammaFloor: 0.1,
        overRange: meter.diode.overRange,
      };
    case 'ohm':
      return {
        s: (x) => (x > 0 ? Math.log(x + R0) : LN_R0),
        ...split(
          stated('ohm', meter, () => SIG_OHM_METER, true),
          () => SIG_OHM_TOL,
        ),
        gammaFloor: 0.5,
        overRange: meter.ohm.overRange,
      };
    case 'continuity':
      return {
        s: (x) => Math.log(Math.max(x, 0) + R0),
        ...split(
          () => 0,
          () => SIG_CONT,
        ),
        gammaFloor: 0.5,
        overRange: meter.continuity.overRange,
      };
  }
}

/** Probability that the meter shows OL given the prediction. */
export function pOL(mode: MeterMode, pred: Prediction, sc: Scale): number {
  if (mode === 'dcv') return 0;
  if (pred.value === 'OL') return 1 - DELTA_CONFUSION;
  if (pred.value === 'unknown') return 0.5;
  const mu = pred.value;
  if (!Number.isFinite(sc.overRange)) return DELTA_CONFUSION;
  return clampP(phi((sc.s(mu) - sc.s(sc.overRange)) / sc.sigma(mu)));
}

export function pBeep(pred: Prediction, meter: MeterProfile): number {
  if (pred.value === 'OL') return DELTA_CONFUSION;
  if (pred.value === 'unknown') return 0.5;
  return clampP(phi((Math.log(meter.continuity.threshold) - Math.log(Math.max(pred.value, 0) + R0)) / SIG_CONT));
}

export function logDensity(z: number, mu: number, sigma: number, gamma: number): number {
  const d = z - mu;
  const g = -0.5 * (d / sigma) ** 2 - Math.log(sigma) - LN_SQRT_2PI;
  const c = -Math.log(Math.PI * gamma * (1 + (d / gamma) ** 2));
  const a = Math.log(1 - EPS_TAIL) + g;
  const b = Math.log(EPS_TAIL) + c;
  const m = Math.max(a, b);
  return m + Math.log(Math.exp(a - m) + Math.exp(b - m));
}

/** The location a prediction gives in the scale (an OL prediction sits at full scale). */
export function location(pred: Prediction, sc: Scale): { mu: number; raw: number } | undefined {
  if (pred.value === 'unknown') return undefined;
  const raw = pred.value === 'OL' ? sc.overRange : pred.value;
  return { mu: sc.s(raw), raw };
}

export function logLikelihood(mode: MeterMode, value: ReadingValue, pred: Prediction, meter: MeterProfile): number {
  if (mode === 'continuity') {
    const beep = value === true;
    const p = pBeep(pred, meter);
    return Math.log(beep ? p : 1 - p);
  }
  const sc = scaleOf(mode, meter);
  const pol = pOL(mode, pred, sc);
  if (value === 'OL') return Math.log(Math.max(pol, DELTA_CONFUSION * 0.01));
  const x = value as number;
  const loc = location(pred, sc);
  if (!loc) return Math.log(0.5) + Math.log(EPS_TAIL) - Math.log(100); // unsolvable prediction: flat, small
  const sigma = sc.sigma(loc.raw);
  const gamma = 5 * sigma + sc.gammaFloor;
  return Math.log(Math.max(1 - pol, 1e-300)) + logDensity(sc.s(x), loc.mu, sigma, gamma);
}

export function consistent(mode: MeterMode, value: ReadingValue, pred: Prediction, meter: MeterProfile): boolean {
  if (pred.value === 'unknown') return false;
  if (mode === 'continuity') return (value === true) === pBeep(pred, meter) > 0.5;
  const sc = scaleOf(mode, meter);
  const predOL = pOL(mode, pred, sc) > 0.5;
  if (value === 'OL' || predOL) return value === 'OL' && predOL;
  const loc = location(pred, sc) as { mu: number; raw: number };
  return Math.abs(sc.s(value as number) - loc.mu) <= BAND_K * sc.sigma(loc.raw);
}

export interface Band {
  expected: number | 'OL' | boolean;
  low?: number;
  high?: number;
}

/** The healthy board's band for a test: expected ± 3σ in the mode's scale, back in raw units. */
export function bandOf(mode: MeterMode, healthy: Prediction, meter: MeterProfile): Band {
  if (mode === 'continuity') return { expected: pBeep(healthy, meter) > 0.5 };
  if (healthy.value === 'OL' || healthy.value === 'unknown') return { expected: 'OL' };
  const sc = scaleOf(mode, meter);
  const v = healthy.value;
  const sd = BAND_K * sc.sigma(v);
  if (mode === 'ohm') {
    const lo = Math.max(0, Math.exp(sc.s(v) - sd) - R0);
    const hi = Math.exp(sc.s(v) + sd) - R0;
    return { expected: v, low: lo, high: hi };
  }
  return { expected: v, low: v - sd, high: v + sd };
}

export type Verdict = 'ok' | 'low' | 'high';

export function verdictOf(mode: MeterMode, value: ReadingValue, band: Band): Verdict {
  if (mode === 'continuity') {
    if (value === band.expected) return 'ok';
    return value === true ? 'low' : 'high';
  }
  if (band.expected === 'OL') return value === 'OL' ? 'ok' : 'low';
  if (value === 'OL') return 'high';
  const x = value as number;
  if (band.low !== undefined && x < band.low) return 'low';
  if (band.high !== undefined && x > band.high) return 'high';
  return 'ok';
}

/**
 * Discretised outcome of a test for probing: bins relative to the healthy band — far-low, low, ok, high,
 * far-high, OL — or beep / silent. The prediction's noise spreads its probability over neighbouring bins.
 */
export function outcomeBins(mode: MeterMode, pred: Prediction, healthy: Prediction, meter: MeterProfile): Array<[string, number]> {
  if (mode === 'continuity') {
    const p = pBeep(pred, meter);
    return [
      ['beep', p],
      ['silent', 1 - p],
    ];
  }
  const sc = scaleOf(mode, meter);
  const pol = pOL(mode, pred, sc);
  const loc = location(pred, sc);
  if (!loc) return [['unknown', 1]];
  const out: Array<[string, number]> = [];
  if (pol > 0) out.push(['OL', pol]);
  const band = bandOf(mode, healthy, meter);
  const sigma = sc.sigma(loc.raw);
  const cdf = (raw: number) => phi((sc.s(raw) - loc.mu) / sigma);
  if (band.expected === 'OL' || band.low === undefined || band.high === undefined) {
    // Healthy reads OL: any number is "low"; split at a decade below full scale.
    const edge = mode === 'ohm' ? sc.overRange / 10 : sc.overRange / 2;
    const a = cdf(edge);
    out.push(['far-low', (1 - pol) * a], ['low', (1 - pol) * (1 - a)]);
    return out;
  }
  const lo = band.low;
  const hi = band.high;
  const farLo = mode === 'ohm' ? lo / 10 : lo > 0 ? lo / 2 : lo - (hi - lo) * 2;
  const farHi = mode === 'ohm' ? hi * 10 : hi > 0 ? hi * 1.5 + (hi - lo) : hi + (hi - lo) * 2;
  const c1 = cdf(farLo);
  const c2 = cdf(lo);
  const c3 = cdf(hi);
  const c4 = cdf(farHi);
  const rest = 1 - pol;
  out.push(['far-low', rest * c1], ['low', rest * (c2 - c1)], ['ok', rest * (c3 - c2)], ['high', rest * (c4 - c3)], ['far-high', rest * (1 - c4)]);
  return out;
}
