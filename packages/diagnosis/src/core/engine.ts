/**
 * Generic diagnosis core: candidates, posterior, evidence, minimal diagnoses.
 *
 * Method:
 * - Candidates are mode-level fault sets: the no-fault candidate, every single fault, and pairs.
 *   Pair rule: when the system has at most `allPairsLimit` components (default 8) every pair of faults on two
 *   different components is scored ("cheap"); otherwise pairs are formed among the `pairTopK` (default 12)
 *   strongest single-fault candidates by posterior. A pair whose two members each fail alone (the {M2, A2}
 *   pattern of the polybox) is only found under the first rule; on large boards it is missed unless one of
 *   its members is among the strongest singles — a documented limitation of the cheap rule.
 * - Posterior ∝ prior × likelihood. The prior of a candidate is the product over components of the mode
 *   prior (faulty) or 1 - Σ fault priors (ok); we carry it relative to the all-ok system. The likelihood of a
 *   parameterised candidate is the sum over its sweep combinations of (prior share × Π reading likelihoods).
 * - Minimal diagnoses follow the consistency-based theory (Reiter 1987, "A theory of diagnosis from first
 *   principles", Artificial Intelligence 32; de Kleer & Williams 1987, "Diagnosing multiple faults",
 *   Artificial Intelligence 32): a component set is a diagnosis when some mode assignment of exactly those
 *   components (others ok) puts every reading within its band; the minimal ones are kept.
 */
import type {
  CandidateEvidence,
  Combo,
  Component,
  FaultRef,
  Observation,
  PartMarginal,
  Posterior,
  ScoredCandidate,
  SubFault,
  SystemModel,
} from './types.js';

export interface DiagnoseOptions {
  /** All pairs when the system has at most this many components. Default 8. */
  allPairsLimit?: number;
  /** Otherwise pairs among this many strongest singles. Default 12. */
  pairTopK?: number;
  /** Include pairs at all. Default true. */
  pairs?: boolean;
  /**
   * Under the top-k rule each pair member keeps only its this many likeliest sweep points (as a single
   * fault given the readings; default 2), so a pair costs at most pairPoints² simulations. The dropped points'
   * share of the prior is dropped with them (a slight under-estimate of the pair).
   */
  pairPoints?: number;
}

/** |ln LR| below this (nats, a factor of about 1.05) is reported as neutral evidence. */
export const NEUTRAL_LLR = 0.05;

export function logSumExp(xs: readonly number[]): number {
  let m = -Infinity;
  for (const x of xs) if (x > m) m = x;
  if (m === -Infinity) return -Infinity;
  let s = 0;
  for (const x of xs) s += Math.exp(x - m);
  return m + Math.log(s);
}

/** Shannon entropy in bits of a probability vector (zeros ignored). */
export function entropyBits(ps: Iterable<number>): number {
  let h = 0;
  for (const p of ps) if (p > 0) h -= p * Math.log2(p);
  return h;
}

/** A mode-level fault with its sweep expanded to sub-faults, and its prior relative to ok. */
interface ModeChoice {
  ref: FaultRef;
  /** ln(prior(mode) / prior(ok of that component)) */
  logRelPrior: number;
  subs: { sub: SubFault; logShare: number }[];
}

export function okPrior(c: Component): number {
  const s = c.modes.reduce((a, m) => a + m.prior, 0);
  return Math.max(1e-12, 1 - s);
}

export function modeChoices(components: readonly Component[]): ModeChoice[] {
  const out: ModeChoice[] = [];
  for (const c of components) {
    const pOk = okPrior(c);
    for (const m of c.modes) {
      if (!(m.prior > 0)) continue;
      const pts = m.points && m.points.length > 0 ? m.points : [{ value: NaN, weight: 1 }];
      const wsum = pts.reduce((a, p) => a + p.weight, 0);
      out.push({
        ref: { part: c.name, mode: m.name },
        logRelPrior: Math.log(m.prior / pOk),
        subs: pts.map((p, i) => ({
          sub: { component: c.name, mode: m.name, point: i, value: p.value },
          logShare: Math.log(p.weight / wsum),
        })),
      });
    }
  }
  return out;
}

export function subFaultKey(faults: readonly SubFault[]): string {
  if (faults.length === 0) return '∅';
  return faults
    .map((f) => `${f.component}:${f.mode}#${f.point}`)
    .sort()
    .join('|');
}

/**
 * Caches predictions per (sub-fault set, test). Predictions never depend on readings, so a cache built for
 * one set of readings serves every later update on the same model.
 */
export class PredictionCache<T, P> {
  private readonly map = new Map<string, Map<string, P>>();
  private readonly testKeys = new WeakMap<object, string>();
  hits = 0;
  misses = 0;
  constructor(private readonly model: SystemModel<T, unknown, P>) {}

  private keyOf(t: T): string {
    if (typeof t !== 'object' || t === null) return this.model.testKey(t);
    let k = this.testKeys.get(t);
    if (k === undefined) {
      k = this.model.testKey(t);
      this.testKeys.set(t, k);
    }
    return k;
  }

  /** One prediction (a cached lookup; predicts on a miss). */
  getOne(faults: readonly SubFault[], test: T, key?: string): P {
    const fk = key ?? subFaultKey(faults);
    const inner = this.map.get(fk);
    const p = inner?.get(this.keyOf(test));
    if (p !== undefined) {
      this.hits++;
      return p;
    }
    return this.get(faults, [test], fk)[0] as P;
  }

  get(faults: readonly SubFault[], tests: readonly T[], key?: string): P[] {
    const fk = key ?? subFaultKey(faults);
    let inner = this.map.get(fk);
    if (!inner) {
      inner = new Map();
      this.map.set(fk, inner);
    }
    const out: (P | undefined)[] = new Array(tests.length);
    let missing: T[] | undefined;
    let missingIdx: number[] | undefined;
    for (let i = 0; i < tests.length; i++) {
      const t = tests[i] as T;
      const k = this.keyOf(t);
      const p = inner.get(k);
      if (p === undefined) {
        (missing ??= []).push(t);
        (missingIdx ??= []).push(i);
      } else {
        out[i] = p;
        this.hits++;
      }
    }
    if (missing && missingIdx) {
      this.misses += missing.length;
      const preds = this.model.predict(faults, missing);
      for (let j = 0; j < missing.length; j++) {
        const p = preds[j] as P;
        inner.set(this.keyOf(missing[j] as T), p);
        out[missingIdx[j] as number] = p;
      }
    }
    return out as P[];
  }

  get size(): number {
    let n = 0;
    for (const m of this.map.values()) n += m.size;
    return n;
  }
}

interface ComboTemplate {
  faults: SubFault[];
  logShare: number;
  key: string;
}

// The sweep combinations of a candidate do not depend on the readings: enumerate once per choice set.
const comboMemo = new WeakMap<readonly ModeChoice[], ComboTemplate[]>();
const choiceSetMemo = new Map<string, WeakMap<ModeChoice, ModeChoice[]>>();

function enumerateCombos(choices: readonly ModeChoice[]): ComboTemplate[] {
  const memo = comboMemo.get(choices);
  if (memo) return memo;
  // Cartesian product of the members' sweep points.
  let combos: { faults: SubFault[]; logShare: number }[] = [{ faults: [], logShare: 0 }];
  for (const ch of choices) {
    const next: typeof combos = [];
    for (const c of combos) for (const s of ch.subs) next.push({ faults: [...c.faults, s.sub], logShare: c.logShare + s.logShare });
    combos = next;
  }
  const out = combos.map((c) => ({ ...c, key: subFaultKey(c.faults) }));
  comboMemo.set(choices, out);
  return out;
}

/** A stable array object per (ordered) set of mode choices, so the combo memo hits across updates. */
function choiceSet(a?: ModeChoice, b?: ModeChoice): readonly ModeChoice[] {
  if (!a) return EMPTY_CHOICES;
  const k = b ? '2' : '1';
  let m = choiceSetMemo.get(k);
  if (!m) {
    m = new WeakMap();
    choiceSetMemo.set(k, m);
  }
  if (!b) {
    let arr = m.get(a);
    if (!arr) {
      arr = [a];
      m.set(a, arr);
    }
    return arr;
  }
  let inner = pairMemo.get(a);
  if (!inner) {
    inner = new WeakMap();
    pairMemo.set(a, inner);
  }
  let arr = inner.get(b);
  if (!arr) {
    arr = [a, b];
    inner.set(b, arr);
  }
  return arr;
}
const EMPTY_CHOICES: readonly ModeChoice[] = [];
const pairMemo = new WeakMap<ModeChoice, WeakMap<ModeChoice, ModeChoice[]>>();

// Mode choices per model (stable objects, so the memos above hit).
const choicesMemo = new WeakMap<object, ModeChoice[]>();
function choicesOf(model: { components: readonly Component[] }): ModeChoice[] {
  let c = choicesMemo.get(model);
  if (!c) {
    c = modeChoices(model.components);
    choicesMemo.set(model, c);
  }
  return c;
}

// Truncated sweeps per (choice, kept points), stable objects for the memos.
const truncMemo = new WeakMap<ModeChoice, Map<string, ModeChoice>>();

function truncatedChoice(ch: ModeChoice, single: Scored, keep: number): ModeChoice {
  if (ch.subs.length <= keep) return ch;
  const ranked = single.combos
    .map((c, i) => ({ i, w: c.logShare + c.perReading.reduce((a, x) => a + x, 0) }))
    .sort((a, b) => b.w - a.w || a.i - b.i)
    .slice(0, keep)
    .map((x) => x.i)
    .sort((a, b) => a - b);
  const k = ranked.join(',');
  let m = truncMemo.get(ch);
  if (!m) {
    m = new Map();
    truncMemo.set(ch, m);
  }
  let t = m.get(k);
  if (!t) {
    t = { ref: ch.ref, logRelPrior: ch.logRelPrior, subs: ranked.map((i) => ch.subs[i] as ModeChoice['subs'][number]) };
    m.set(k, t);
  }
  return t;
}

interface Scored {
  refs: FaultRef[];
  logPrior: number;
  combos: { faults: SubFault[]; key: string; logShare: number; perReading: number[]; consistent: boolean }[];
}

function scoreCandidate<T, V, P>(
  model: SystemModel<T, V, P>,
  cache: PredictionCache<T, P>,
  choices: readonly ModeChoice[],
  observations: readonly Observation<T, V>[],
  tests: readonly T[],
): Scored {
  const refs = choices.map((c) => c.ref);
  const logPrior = choices.reduce((a, c) => a + c.logRelPrior, 0);
  const combos = enumerateCombos(choices);
  return {
    refs,
    logPrior,
    combos: combos.map((c) => {
      const preds = cache.get(c.faults, tests, c.key);
      const perReading = observations.map((o, i) => model.logLikelihood(o.test, o.value, preds[i] as P));
      const consistent = observations.every((o, i) => model.consistent(o.test, o.value, preds[i] as P));
      return { faults: c.faults, key: c.key, logShare: c.logShare, perReading, consistent };
    }),
  };
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
  const choices = choicesOf(model);

  const scored: Scored[] = [];
  scored.push(scoreCandidate(model, cache, choiceSet(), observations, tests));
  const singles: { ch: ModeChoice; s: Scored; logPost: number }[] = [];
  for (const ch of choices) {
    const s = scoreCandidate(model, cache, choiceSet(ch), observations, tests);
    scored.push(s);
    singles.push({ ch, s, logPost: s.logPrior + logMarginal(s) });
  }

  let pairRule: Posterior['pairRule'] = 'none';
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
        .map((x) => truncatedChoice(x.ch, x.s, pairPoints));
    }
    for (let i = 0; i < pool.length; i++) {
      for (let j = i + 1; j < pool.length; j++) {
        const a = pool[i] as ModeChoice;
        const b = pool[j] as ModeChoice;
        if (a.ref.part === b.ref.part) continue;
        scored.push(scoreCandidate(model, cache, choiceSet(a, b), observations, tests));
      }
    }
  }
  return buildPosterior(scored, observations.length, pairRule);
}

function logMarginal(s: Scored): number {
  return logSumExp(s.combos.map((c) => c.logShare + c.perReading.reduce((a, x) => a + x, 0)));
}

function buildPosterior(scored: Scored[], nReadings: number, pairRule: Posterior['pairRule']): Posterior {
  const noFault = scored[0] as Scored;
  const healthyPer = (noFault.combos[0] as Scored['combos'][number]).perReading;
  const logPosts = scored.map((s) => s.logPrior + logMarginal(s));
  const z = logSumExp(logPosts);
  const candidates: ScoredCandidate[] = scored.map((s, idx) => {
    const logW = s.combos.map((c) => c.logShare + c.perReading.reduce((a, x) => a + x, 0));
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
    return {
      faults: s.refs,
      probability: Math.exp((logPosts[idx] as number) - z),
      logPrior: s.logPrior,
      logLikelihood: lz,
      consistent: s.combos.some((c) => c.consistent),
      combos,
      evidence,
    };
  });
  candidates.sort((a, b) => b.probability - a.probability);
  return {
    candidates,
    parts: partMarginals(candidates),
    minimalDiagnoses: minimalDiagnoses(candidates),
    entropy: entropyBits(candidates.map((c) => c.probability)),
    pairRule,
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
