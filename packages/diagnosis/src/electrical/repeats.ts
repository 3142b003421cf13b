/**
 * Repeated readings of one quantity, and the broad density of the unmodelled-fault hypothesis.
 *
 * Repeats. Readings of the same quantity on one board — same meter mode, the same probed nets (a different test
 * point on the same net is the same quantity), the same power state and the same lifted parts — share the
 * part-tolerance error: the board's real parts differ from their nominal values once, not per reading. Only the
 * meter's repeatability is fresh per reading. With x_i = μ + t + m_i, t ~ N(0, σ_tol²) shared and
 * m_i ~ N(0, σ_meter²) independent, the joint density of k numeric readings factors into
 *   N(x̄; μ, σ_tol² + σ_meter²/k) × (a term in the scatter about x̄ that does not depend on μ),
 * the standard result for a Gaussian random-effects model (any linear-models textbook; the sufficient statistic
 * of μ is the mean). The second factor is the same for every candidate and cancels in the posterior, so a group
 * scores as ONE reading at its mean with the meter term shrunk by k: repeats refine, they do not multiply.
 * Discrete repeats (OL, beep / no beep) carry no refinement; a group mixing kinds scores as the average of its
 * members' log-likelihoods, the numeric mean counting for its k members — still one reading's worth of evidence.
 *
 * Broad density ("something the model does not hold"): dcv uniform over ±1.2 × the largest source voltage of
 * the board; ohm uniform in ln R over the meter's range with OL at probability 0.3; diode uniform over the
 * meter's range with OL at 0.3; continuity beep 0.5. The numbers are a modelling choice (from memory): wide
 * enough that any reading is possible, so the hypothesis gains only when no modelled candidate predicts a reading.
 */
import type { MeterProfile } from '@splitscope/circuit';
import { BAND_K, consistent, location, logDensity, logLikelihood, pOL, R0, scaleOf, type MeterMode, type Prediction, type ReadingValue } from './noise.js';

/** Several readings of one quantity (in the order taken). */
export interface RepeatedReading {
  repeats: ReadingValue[];
}

export type ObservedValue = ReadingValue | RepeatedReading;

export const isRepeated = (v: ObservedValue): v is RepeatedReading => typeof v === 'object' && v !== null && Array.isArray((v as RepeatedReading).repeats);

/** The numeric members' mean in the mode's scale, back in raw units, and their count. */
function numericMean(mode: MeterMode, values: readonly ReadingValue[], meter: MeterProfile): { raw: number; k: number } | undefined {
  const nums = values.filter((v): v is number => typeof v === 'number');
  if (nums.length === 0 || mode === 'continuity') return undefined;
  const sc = scaleOf(mode, meter);
  const m = nums.reduce((a, x) => a + sc.s(x), 0) / nums.length;
  const raw = mode === 'ohm' ? Math.max(0, Math.exp(m) - R0) : m;
  return { raw, k: nums.length };
}

/** ln L of a numeric mean of k readings: meter term σ_meter/√k, tolerance term whole. */
function meanLogLikelihood(mode: MeterMode, mean: { raw: number; k: number }, pred: Prediction, meter: MeterProfile): number {
  const sc = scaleOf(mode, meter);
  const loc = location(pred, sc);
  if (!loc) return logLikelihood(mode, mean.raw, pred, meter);
  const sigma = Math.hypot(sc.sigmaMeter(loc.raw) / Math.sqrt(mean.k), sc.sigmaTol(loc.raw));
  const gamma = 5 * sc.sigma(loc.raw) + sc.gammaFloor;
  const pol = pOL(mode, pred, sc);
  return Math.log(Math.max(1 - pol, 1e-300)) + logDensity(sc.s(mean.raw), loc.mu, sigma, gamma);
}

export function groupLogLikelihood(mode: MeterMode, value: ObservedValue, pred: Prediction, meter: MeterProfile): number {
  if (!isRepeated(value)) return logLikelihood(mode, value, pred, meter);
  const vals = value.repeats;
  if (vals.length === 1) return logLikelihood(mode, vals[0] as ReadingValue, pred, meter);
  const mean = numericMean(mode, vals, meter);
  let total = 0;
  if (mean) total += mean.k * meanLogLikelihood(mode, mean, pred, meter);
  for (const v of vals) if (typeof v !== 'number' || mode === 'continuity') total += logLikelihood(mode, v, pred, meter);
  return total / vals.length;
}

export function groupConsistent(mode: MeterMode, value: ObservedValue, pred: Prediction, meter: MeterProfile): boolean {
  if (!isRepeated(value)) return consistent(mode, value, pred, meter);
  const vals = value.repeats;
  const mean = numericMean(mode, vals, meter);
  for (const v of vals) if ((typeof v !== 'number' || mode === 'continuity') && !consistent(mode, v, pred, meter)) return false;
  if (!mean) return true;
  const sc = scaleOf(mode, meter);
  const loc = location(pred, sc);
  if (!loc || pOL(mode, pred, sc) > 0.5) return consistent(mode, mean.raw, pred, meter);
  const sigma = Math.hypot(sc.sigmaMeter(loc.raw) / Math.sqrt(mean.k), sc.sigmaTol(loc.raw));
  return Math.abs(sc.s(mean.raw) - loc.mu) <= BAND_K * sigma;
}

const P_OL_BROAD = 0.3;

/** ln density of one reading under the broad alternative (see the header). `vmax`: largest source, volts. */
function broadOne(mode: MeterMode, value: ReadingValue, meter: MeterProfile, vmax: number): number {
  switch (mode) {
    case 'continuity':
      return Math.log(0.5);
    case 'dcv':
      return -Math.log(2 * Math.max(1.2 * vmax, 1));
    case 'ohm': {
      if (value === 'OL') return Math.log(P_OL_BROAD);
      const sc = scaleOf(mode, meter);
      return Math.log(1 - P_OL_BROAD) - Math.log(sc.s(meter.ohm.overRange) - sc.s(0));
    }
    case 'diode':
      if (value === 'OL') return Math.log(P_OL_BROAD);
      return Math.log(1 - P_OL_BROAD) - Math.log(meter.diode.overRange);
  }
}

export function broadLogLikelihood(mode: MeterMode, value: ObservedValue, meter: MeterProfile, vmax: number): number {
  if (!isRepeated(value)) return broadOne(mode, value, meter, vmax);
  const vals = value.repeats;
  return vals.reduce((a: number, v) => a + broadOne(mode, v, meter, vmax), 0) / vals.length;
}
