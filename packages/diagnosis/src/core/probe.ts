/**
 * Best next test: minimum-entropy probing (de Kleer & Williams 1987, "Diagnosing multiple faults",
 * Artificial Intelligence 32, section on choosing the next measurement), weighed by cost.
 *
 * For a test t with discretised outcomes o (bins such as low/ok/high, OL, beep):
 *   P(o | c) = Σ over the candidate's sweep combinations of weight × P(o | prediction)   (model.outcomes)
 *   P(o)     = Σ_c P(c) P(o | c)
 *   E[H after t] = Σ_o P(o) H(C | o),   H(C | o) the entropy of P(c | o) ∝ P(c) P(o | c).
 * When outcomes are deterministic given the candidate, minimising E[H after t] is maximising the outcome
 * entropy H(O) — the form the paper uses. We rank by information gain per unit cost,
 * (H(C) - E[H after t]) / cost, ties broken by the lower expected entropy and then the cheaper test; the cost
 * model (moving a probe, changing power state, lifting a part) is the caller's.
 */
import { PredictionCache, entropyBits } from './engine.js';
import type { Posterior, ScoredCandidate, SystemModel } from './types.js';

export interface ProbeOptions {
  /** Only candidates covering this much posterior mass are considered (the rest changes nothing). */
  massCutoff?: number;
  /** At most this many candidates. */
  maxCandidates?: number;
  /** Sweep combinations with a weight below this fraction of the candidate's best are skipped. */
  comboCutoff?: number;
  /** At most this many sweep combinations per candidate (the heaviest; weights renormalised). */
  maxCombos?: number;
}

export interface TestScore<T> {
  test: T;
  expectedEntropy: number;
  outcomeEntropy: number;
  gain: number;
  cost: number;
  score: number;
}

/** Select the candidates (and their significant combos) used for probing, renormalised. */
export interface ActiveCandidate {
  cand: ScoredCandidate;
  p: number;
  combos: { faults: ScoredCandidate['combos'][number]['faults']; key?: string; w: number }[];
}

export function activeSet(posterior: Posterior, options: ProbeOptions = {}): ActiveCandidate[] {
  const massCutoff = options.massCutoff ?? 0.9999;
  const maxCandidates = options.maxCandidates ?? 60;
  const comboCutoff = options.comboCutoff ?? 1e-3;
  const maxCombos = options.maxCombos ?? Infinity;
  const out: ReturnType<typeof activeSet> = [];
  let mass = 0;
  for (const c of posterior.candidates) {
    if (out.length >= maxCandidates || mass >= massCutoff) break;
    if (!(c.probability > 0)) break;
    let wmax = 0;
    for (const k of c.combos) if (k.weight > wmax) wmax = k.weight;
    let combos = c.combos.filter((k) => k.weight >= wmax * comboCutoff).map((k) => ({ faults: k.faults, key: k.key, w: k.weight }));
    if (combos.length > maxCombos) combos = combos.sort((a, b) => b.w - a.w).slice(0, maxCombos);
    const ws = combos.reduce((a, k) => a + k.w, 0);
    for (const k of combos) k.w /= ws;
    out.push({ cand: c, p: c.probability, combos });
    mass += c.probability;
  }
  const z = out.reduce((a, x) => a + x.p, 0);
  for (const x of out) x.p /= z;
  return out;
}

/** Expected posterior entropy and outcome entropy of one test over a weighted candidate set. */
export function testEntropy<T, P>(
  model: SystemModel<T, unknown, P>,
  cache: PredictionCache<T, P>,
  active: readonly ActiveCandidate[],
  test: T,
): { expectedEntropy: number; outcomeEntropy: number } {
  return entropyOf(model, active, test, (ci, ki) => {
    const k = (active[ci] as ActiveCandidate).combos[ki] as ActiveCandidate['combos'][number];
    return cache.getOne(k.faults, test, k.key);
  });
}

/** testEntropy with the prediction of the ki-th combination of the ci-th candidate from `predOf`. */
function entropyOf<T, P>(
  model: SystemModel<T, unknown, P>,
  active: readonly ActiveCandidate[],
  test: T,
  predOf: (ci: number, ki: number) => P,
): { expectedEntropy: number; outcomeEntropy: number } {
  // joint[o][c] = P(c) P(o | c)
  const joint = new Map<string, Float64Array>();
  const predicted = model.predicted?.bind(model);
  // Mass of sweep combinations whose prediction could not be computed: such a combination tells nothing, so
  // its mass follows the outcome distribution of the rest (never a distinct "unknown" outcome).
  let lost: Float64Array | undefined;
  for (let ci = 0; ci < active.length; ci++) {
    const a = active[ci] as ActiveCandidate;
    for (let ki = 0; ki < a.combos.length; ki++) {
      const k = a.combos[ki] as ActiveCandidate['combos'][number];
      const pred = predOf(ci, ki);
      if (predicted && !predicted(pred)) {
        lost ??= new Float64Array(active.length);
        lost[ci] = (lost[ci] as number) + a.p * k.w;
        continue;
      }
      for (const [bin, po] of model.outcomes(test, pred)) {
        if (!(po > 0)) continue;
        let row = joint.get(bin);
        if (!row) {
          row = new Float64Array(active.length);
          joint.set(bin, row);
        }
        row[ci] = (row[ci] as number) + a.p * k.w * po;
      }
    }
  }
  if (lost) spreadLost(joint, lost);
  let expected = 0;
  const pos: number[] = [];
  for (const row of joint.values()) {
    let po = 0;
    for (const x of row) po += x;
    if (!(po > 0)) continue;
    pos.push(po);
    let h = 0;
    for (const x of row) if (x > 0) h -= (x / po) * Math.log2(x / po);
    expected += po * h;
  }
  return { expectedEntropy: expected, outcomeEntropy: entropyBits(pos) };
}

/** Adds each candidate's unpredicted mass to the outcomes in proportion to the predicted outcome marginal. */
function spreadLost(joint: Map<string, Float64Array>, lost: Float64Array): void {
  const marg = new Map<string, number>();
  let total = 0;
  for (const [bin, row] of joint) {
    let po = 0;
    for (const x of row) po += x;
    marg.set(bin, po);
    total += po;
  }
  if (!(total > 0)) {
    // Nothing predicted: one uninformative outcome.
    joint.set('unpredicted', Float64Array.from(lost));
    return;
  }
  for (const [bin, row] of joint) {
    const share = (marg.get(bin) as number) / total;
    for (let ci = 0; ci < row.length; ci++) row[ci] = (row[ci] as number) + (lost[ci] as number) * share;
  }
}

export function rankTests<T, P>(
  model: SystemModel<T, unknown, P>,
  posterior: Posterior,
  tests: readonly T[],
  cost: (test: T) => number,
  options: ProbeOptions = {},
  cache: PredictionCache<T, P> = new PredictionCache(model),
): TestScore<T>[] {
  const active = activeSet(posterior, options);
  // One predict call per combination for all tests (a model can share work across tests in the same state);
  // the scoring below reads these arrays instead of looking every prediction up again.
  const preds = active.map((a) => a.combos.map((k) => cache.get(k.faults, tests, k.key)));
  const h0 = entropyBits(active.map((a) => a.p));
  const scores = tests.map((test, ti) => {
    const { expectedEntropy, outcomeEntropy } = entropyOf(model, active, test, (ci, ki) => ((preds[ci] as P[][])[ki] as P[])[ti] as P);
    const c = Math.max(cost(test), 1e-9);
    const gain = Math.max(0, h0 - expectedEntropy);
    return { test, expectedEntropy, outcomeEntropy, gain, cost: c, score: gain / c };
  });
  scores.sort((a, b) => b.score - a.score || a.expectedEntropy - b.expectedEntropy || a.cost - b.cost);
  return scores;
}
