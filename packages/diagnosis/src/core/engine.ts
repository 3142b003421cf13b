/**
 * Generic diagnosis core: candidates, posterior, evidence, minimal diagnoses.
 *
 * Method:
 * - Candidates are mode-level fault sets: the no-fault candidate, every single fault, pairs and some triples.
 *   Pair rule: when the system has at most `allPairsLimit` components (default 8) every pair of faults on two
 *   different components is scored ("cheap"); otherwise pairs are formed among the `pairTopK` (default 12)
 *   strongest single-fault candidates by posterior, and further pairs and triples are generated from the
 *   conflicts of the readings the strongest singles leave unexplained (conflicts.ts, with its documented bound),
 *   so a fault invisible alone is paired with the visible one it hides behind.
 * - Posterior ∝ prior × likelihood. The prior of a candidate is the product over components of the mode
 *   prior (faulty) or 1 - Σ fault priors (ok); we carry it relative to the all-ok system. The likelihood of a
 *   parameterised candidate is the sum over its sweep combinations of (prior share × Π reading likelihoods).
 * - Unmodelled fault: when the model gives a broad density (`logLikelihoodBroad`), one more hypothesis "a fault
 *   the model does not hold" is scored, with prior `unmodelledPrior` (default 0.05 per job, from memory: DC
 *   models miss lost capacitance, intermittents, firmware) and, per reading, the likelihood
 *   (1 - q)·L(reading | healthy) + q·L_broad(reading), q = `unmodelledShare` (default 0.3): such a fault leaves
 *   most readings as on a healthy board and throws some anywhere in the meter's range. This is the "unknown
 *   mode" of de Kleer & Williams 1989 ("Diagnosis with behavioral modes", IJCAI; from memory) with a broad
 *   density instead of no prediction, so the posterior stays a proper probability: when no modelled candidate
 *   explains the readings, its mass grows and every modelled candidate's probability drops.
 * - Minimal diagnoses follow the consistency-based theory (Reiter 1987, "A theory of diagnosis from first
 *   principles", Artificial Intelligence 32; de Kleer & Williams 1987, "Diagnosing multiple faults",
 *   Artificial Intelligence 32): a component set is a diagnosis when some mode assignment of exactly those
 *   components (others ok) puts every reading within its band; the minimal ones are kept.
 */
import { PredictionCache } from './cache.js';
import { choicesOf, choiceSet, truncatedChoice, type ModeChoice } from './choices.js';
import { adjustedChoices, type PriorAdjustment } from './priors.js';
import { extendByConflicts, type ConflictOptions } from './conflicts.js';
import { comboLogWeight, heaviest, logMarginal, logSumExp, scoreCandidate, type Scored } from './scoring.js';
import type { CandidateEvidence, Combo, FaultRef, Observation, PartMarginal, Posterior, ScoredCandidate, SystemModel } from './types.js';

export { subFaultKey, PredictionCache } from './cache.js';
export { modeChoices, okPrior } from './choices.js';
export { logSumExp } from './scoring.js';

export interface DiagnoseOptions {
  /** All pairs when the system has at most this many components. Default 8. */
  allPairsLimit?: number;
  /** Otherwise pairs among this many strongest singles. Default 12. */
  pairTopK?: number;
  /** Include pairs (and conflict-driven triples) at all. Default true. */
  pairs?: boolean;
  /**
   * Under the top-k rule each pair member keeps only its this many likeliest sweep points (as a single
   * fault given the readings; default 2), so a pair costs at most pairPoints² simulations. The dropped points'
   * share of the prior is dropped with them (a slight under-estimate of the pair).
   */
  pairPoints?: number;
  /** Bounds of the conflict-driven candidates (conflicts.ts); `false` turns them off. */
  conflicts?: ConflictOptions | false;
  /** Prior of the unmodelled-fault hypothesis (default 0.05); 0 turns it off. */
  unmodelledPrior?: number;
  /** Share of the broad density in a reading's likelihood under the unmodelled hypothesis (default 0.3). */
  unmodelledShare?: number;
  /** Per-job prior adjustments (priors.ts); the model itself is not rebuilt. Reported in `priorChanges`. */
  priors?: readonly PriorAdjustment[];
}

/** |ln LR| below this (nats, a factor of about 1.05) is reported as neutral evidence. */
export const NEUTRAL_LLR = 0.05;

/** Shannon entropy in bits of a probability vector (zeros ignored). */
export function entropyBits(ps: Iterable<number>): number {
  let h = 0;
  for (const p of ps) if (p > 0) h -= p * Math.log2(p);
  return h;
}

export function refsKey(refs: readonly FaultRef[]): string {
  return refs
    .map((r) => `${r.part}:${r.mode}`)
    .sort()
    .join('|');
}

/** Score every candidate against the readings and build the posterior. */
export function diagnose<T, V, P>(
  model: SystemModel<T, V, P>,
  observations: readonly Observation<T, V>[],
  options: DiagnoseOptions = {},
  cache: PredictionCache<T, P> = new PredictionCache(model),
): Posterior {
  const allPairsLimit = options.allPairsLimit ?? 8;
  const pairTopK = options.pairTopK ?? 12;
  const pairPoints = options.pairPoints ?? 2;
  const tests = observations.map((o) => o.test);
  const adjusted = adjustedChoices(model, choicesOf(model), options.priors ?? []);
  const choices = adjusted.choices;

  // The healthy system first: its per-reading scores stand in for predictions a candidate cannot compute.
  const noFault = scoreCandidate(model, cache, choiceSet(), observations, tests);
  const healthy = noFault.combos[0] as Scored['combos'][number];
  const excluded = new Set(healthy.unpredicted);
  const score = (set: readonly ModeChoice[]) => scoreCandidate(model, cache, set, observations, tests, healthy, excluded);

  const scored: Scored[] = [noFault];
  const singles: { ch: ModeChoice; s: Scored; logPost: number }[] = [];
  for (const ch of choices) {
    const s = score(choiceSet(ch));
    scored.push(s);
    singles.push({ ch, s, logPost: s.logPrior + logMarginal(s) });
  }

  let pairRule: Posterior['pairRule'] = 'none';
  const generated = { pairs: 0, triples: 0, capped: false };
  if (options.pairs !== false) {
    let pool: ModeChoice[];
    if (model.components.length <= allPairsLimit) {
      pairRule = 'all';
      pool = choices;
    } else {
      pairRule = 'top-k';
      pool = [...singles]
        .sort((a, b) => b.logPost - a.logPost)
        .slice(0, pairTopK)
        .map((x) => truncatedChoice(x.ch, x.s.combos.map(comboLogWeight), pairPoints));
    }
    const seen = new Set<string>();
    for (let i = 0; i < pool.length; i++) {
      for (let j = i + 1; j < pool.length; j++) {
        const a = pool[i] as ModeChoice;
        const b = pool[j] as ModeChoice;
        if (a.ref.part === b.ref.part) continue;
        seen.add(refsKey([a.ref, b.ref]));
        scored.push(score(choiceSet(a, b)));
      }
    }
    if (pairRule === 'top-k' && options.conflicts !== false) {
      const suspects = model.suspects?.bind(model);
      const ext = extendByConflicts(
        {
          singles,
          healthy: healthy.perReading,
          symptoms: healthy.bad,
          suspects: (r) => (suspects ? suspects((observations[r] as Observation<T, V>).test) : []),
          seen,
          score,
          refsKey,
        },
        { points: pairPoints, ...(options.conflicts ?? {}) },
      );
      scored.push(...ext.scored);
      Object.assign(generated, { pairs: ext.pairs, triples: ext.triples, capped: ext.capped });
    }
  }

  // The unmodelled-fault hypothesis (see the header).
  let unmodelledLog: { logPrior: number; logLikelihood: number } | undefined;
  const pU = options.unmodelledPrior ?? 0.05;
  if (model.logLikelihoodBroad && pU > 0) {
    const q = options.unmodelledShare ?? 0.3;
    let ll = 0;
    observations.forEach((o, i) => {
      if (excluded.has(i)) return;
      const b = (model.logLikelihoodBroad as NonNullable<typeof model.logLikelihoodBroad>)(o.test, o.value);
      ll += logSumExp([Math.log(1 - q) + (healthy.perReading[i] as number), Math.log(q) + b]);
    });
    unmodelledLog = { logPrior: Math.log(pU / (1 - pU)), logLikelihood: ll };
  }
  return { ...buildPosterior(scored, observations.length, pairRule, generated, unmodelledLog, [...excluded]), priorChanges: adjusted.changes };
}

function buildPosterior(
  scored: Scored[],
  nReadings: number,
  pairRule: Posterior['pairRule'],
  generated: Posterior['generated'],
  unmodelled: { logPrior: number; logLikelihood: number } | undefined,
  excluded: number[],
): Posterior {
  const healthyPer = ((scored[0] as Scored).combos[0] as Scored['combos'][number]).perReading;
  const logPosts = scored.map((s) => s.logPrior + logMarginal(s));
  const uLogPost = unmodelled ? unmodelled.logPrior + unmodelled.logLikelihood : -Infinity;
  const z = logSumExp([...logPosts, uLogPost]);
  const candidates: ScoredCandidate[] = scored.map((s, idx) => {
    const logW = s.combos.map(comboLogWeight);
    const lz = logSumExp(logW);
    const combos: Combo[] = s.combos.map((c, k) => ({
      faults: c.faults,
      key: c.key,
      logWeight: logW[k] as number,
      weight: lz === -Infinity ? 1 / s.combos.length : Math.exp((logW[k] as number) - lz),
    }));
    // Per-reading evidence: the reading's likelihood under the candidate, mixed over its sweep combinations
    // with their posterior weights (the sub-modes the readings as a whole favour), against no fault.
    const evidence: CandidateEvidence[] = [];
    for (let i = 0; i < nReadings; i++) {
      const li = logSumExp(s.combos.map((c, k) => Math.log(Math.max((combos[k] as Combo).weight, 1e-300)) + (c.perReading[i] as number)));
      const llr = li - (healthyPer[i] as number);
      evidence.push({ index: i, llr, sign: llr > NEUTRAL_LLR ? 'supports' : llr < -NEUTRAL_LLR ? 'against' : 'neutral' });
    }
    const unpredicted = new Set<number>();
    for (const c of s.combos) for (const i of c.unpredicted) unpredicted.add(i);
    return {
      faults: s.refs,
      probability: Math.exp((logPosts[idx] as number) - z),
      logPrior: s.logPrior,
      logLikelihood: lz,
      consistent: s.combos.some((c) => c.bad.length === 0),
      combos,
      evidence,
      disagree: heaviest(s).bad,
      unpredicted: [...unpredicted].sort((a, b) => a - b),
    };
  });
  candidates.sort((a, b) => b.probability - a.probability);
  const pU = unmodelled ? Math.exp(uLogPost - z) : 0;
  return {
    candidates,
    parts: partMarginals(candidates),
    minimalDiagnoses: minimalDiagnoses(candidates),
    entropy: entropyBits([...candidates.map((c) => c.probability), pU]),
    pairRule,
    generated,
    ...(unmodelled ? { unmodelled: { probability: pU, logLikelihood: unmodelled.logLikelihood } } : {}),
    excluded,
  };
}

export function partMarginals(candidates: readonly ScoredCandidate[]): PartMarginal[] {
  const m = new Map<string, PartMarginal>();
  for (const c of candidates) {
    for (const f of c.faults) {
      const k = `${f.part}\u0000${f.mode}`;
      const e = m.get(k);
      if (e) e.probability += c.probability;
      else m.set(k, { part: f.part, mode: f.mode, probability: c.probability });
    }
  }
  return [...m.values()].sort((a, b) => b.probability - a.probability || a.part.localeCompare(b.part));
}

/**
 * Minimal diagnoses: component sets of consistent candidates, keeping only those with no consistent proper
 * subset. Several modes of the same components collapse to one set. Sorted by best posterior.
 */
export function minimalDiagnoses(candidates: readonly ScoredCandidate[]): string[][] {
  const best = new Map<string, { set: string[]; p: number }>();
  for (const c of candidates) {
    if (!c.consistent) continue;
    const set = [...new Set(c.faults.map((f) => f.part))].sort();
    const k = set.join('|');
    const e = best.get(k);
    if (!e || e.p < c.probability) best.set(k, { set, p: (e?.p ?? 0) + c.probability });
    else e.p += c.probability;
  }
  const sets = [...best.values()];
  const minimal = sets.filter((a) => !sets.some((b) => b !== a && b.set.length < a.set.length && b.set.every((x) => a.set.includes(x))));
  minimal.sort((a, b) => b.p - a.p || a.set.length - b.set.length || a.set.join().localeCompare(b.set.join()));
  return minimal.map((x) => x.set);
}
