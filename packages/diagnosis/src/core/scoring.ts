/**
 * Scoring one candidate (a set of mode choices) against the readings: per sweep combination, the log-likelihood
 * of each reading and which readings fall outside their band.
 *
 * A prediction the model could not compute (`model.predicted` false: the circuit does not solve in that state)
 * is left out of scoring: the reading counts for that combination exactly as it counts for the healthy system
 * (neutral evidence, same band verdict), and the reading index is listed in `unpredicted`. When the healthy
 * system's own prediction cannot be computed, the reading is excluded for every candidate (log-likelihood 0,
 * never a disagreement) and listed in `excluded`.
 */
import type { PredictionCache } from './cache.js';
import { enumerateCombos, type ModeChoice } from './choices.js';
import type { FaultRef, Observation, SubFault, SystemModel } from './types.js';

export interface ScoredCombo {
  faults: SubFault[];
  key: string;
  logShare: number;
  perReading: number[];
  /** Readings outside their band. */
  bad: number[];
  /** Readings whose prediction could not be computed. */
  unpredicted: number[];
}

export interface Scored {
  refs: FaultRef[];
  logPrior: number;
  combos: ScoredCombo[];
}

export function logSumExp(xs: readonly number[]): number {
  let m = -Infinity;
  for (const x of xs) if (x > m) m = x;
  if (m === -Infinity) return -Infinity;
  let s = 0;
  for (const x of xs) s += Math.exp(x - m);
  return m + Math.log(s);
}

export const comboLogWeight = (c: ScoredCombo) => c.logShare + c.perReading.reduce((a, x) => a + x, 0);

export function logMarginal(s: Scored): number {
  return logSumExp(s.combos.map(comboLogWeight));
}

/** The combination with the highest weight given the readings. */
export function heaviest(s: Scored): ScoredCombo {
  let best = s.combos[0] as ScoredCombo;
  let bw = -Infinity;
  for (const c of s.combos) {
    const w = comboLogWeight(c);
    if (w > bw) {
      bw = w;
      best = c;
    }
  }
  return best;
}

export function scoreCandidate<T, V, P>(
  model: SystemModel<T, V, P>,
  cache: PredictionCache<T, P>,
  choices: readonly ModeChoice[],
  observations: readonly Observation<T, V>[],
  tests: readonly T[],
  healthy?: ScoredCombo,
  excluded?: ReadonlySet<number>,
): Scored {
  const refs = choices.map((c) => c.ref);
  const logPrior = choices.reduce((a, c) => a + c.logRelPrior, 0);
  const predicted = model.predicted?.bind(model);
  const healthyBad = healthy ? new Set(healthy.bad) : undefined;
  return {
    refs,
    logPrior,
    combos: enumerateCombos(choices).map((c) => {
      const preds = cache.get(c.faults, tests, c.key);
      const perReading: number[] = new Array(observations.length);
      const bad: number[] = [];
      const unpredicted: number[] = [];
      for (let i = 0; i < observations.length; i++) {
        const o = observations[i] as Observation<T, V>;
        const p = preds[i] as P;
        if (excluded?.has(i)) {
          perReading[i] = 0;
        } else if (predicted && !predicted(p)) {
          unpredicted.push(i);
          perReading[i] = healthy ? (healthy.perReading[i] as number) : 0;
          if (healthyBad?.has(i)) bad.push(i);
        } else {
          perReading[i] = model.logLikelihood(o.test, o.value, p);
          if (!model.consistent(o.test, o.value, p)) bad.push(i);
        }
      }
      return { faults: c.faults, key: c.key, logShare: c.logShare, perReading, bad, unpredicted };
    }),
  };
}
