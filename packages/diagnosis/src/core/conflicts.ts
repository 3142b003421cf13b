/**
 * Multiple-fault candidates from conflicts (de Kleer & Williams 1987, "Diagnosing multiple faults", Artificial
 * Intelligence 32, candidate generation; Reiter 1987, "A theory of diagnosis from first principles", Artificial
 * Intelligence 32: a diagnosis hits every conflict).
 *
 * A conflict is a set of components not all of which can be ok. Here the conflict of a reading r that a candidate
 * leaves outside its band is
 *   conflict(r) = suspects(r) ∪ supporters(r),
 * suspects(r) the components the model names as r's structural neighbourhood (for a circuit: the parts with a pin
 * on a probed net), supporters(r) the components one of whose single faults explains r (single-fault evidence for
 * r above SUPPORT_LLR nats). GDE's candidate generation extends every candidate that does not hit a new conflict
 * by each member of that conflict; we do the same for the strongest single candidates that leave readings
 * unexplained (their residual readings), so a fault that is invisible alone (a collector–emitter short on a
 * switch that conducts anyway) is paired with the visible one (the rail capacitor short) whenever it sits in the
 * conflict of what the visible one leaves unexplained. With fault modes, minimality at component level does not
 * hold (a superset of a non-diagnosis can be a diagnosis), so all such extensions are scored, not only minimal
 * hitting sets.
 *
 * Bound (documented, every number an option):
 * - seeds (at most `seeds`, default 8, each leaving a reading outside its band): for every symptom (a reading
 *   outside its healthy band) the single with the best evidence for it and up to 2 twins within 0.5 nat (parts the
 *   readings cannot tell apart: capacitors on one rail), then the strongest singles by posterior;
 * - per seed at most `extensions` (default 32) mode choices, taken from the parts of the residual conflicts in
 *   order of how many residual conflicts the part hits, then by the part's best single posterior;
 * - each pair member keeps its `points` (default 2) likeliest sweep points, except that the seed keeps its whole
 *   sweep (S points) with its first `fullSweep` (default 8) extensions, and a mode invisible alone (no reading
 *   moves by SUPPORT_LLR) keeps its whole sweep (T points; it has no "likeliest" points): ≤ seeds × (fullSweep ×
 *   S × T + (extensions − fullSweep) × points × T) sweep combinations (8 × (8 × 6 × 3 + 24 × 2 × 3) = 2304 for
 *   S = 6, T = 3; far fewer in practice, most extensions being visible);
 * - triples: the `triples` (default 3) strongest generated pairs that still leave a reading unexplained are
 *   extended the same way by at most `tripleExtensions` (default 12) mode choices, one sweep point per member;
 * - a wall-clock cap `timeMs` (default 60 s: a safety net, the step takes a few seconds cold on the demo board)
 *   on the whole step; when it cuts the list, `capped` is reported
 *   (the count caps above always apply and are not reported).
 */
import { choiceSet, truncatedChoice, type ModeChoice } from './choices.js';
import { comboLogWeight, heaviest, logMarginal, type Scored } from './scoring.js';
import type { FaultRef } from './types.js';

export interface ConflictOptions {
  seeds?: number;
  extensions?: number;
  points?: number;
  triples?: number;
  tripleExtensions?: number;
  fullSweep?: number;
  timeMs?: number;
}

/** Single-fault evidence (nats) above which a component counts as explaining a reading. */
export const SUPPORT_LLR = 2;
/** Singles within this many nats of a symptom's best support are its twins; at most TWINS are seeds per symptom. */
const TWIN_NATS = 0.5;
const TWINS = 3;

export interface SingleScore {
  ch: ModeChoice;
  s: Scored;
  logPost: number;
}

export interface ConflictInput {
  singles: readonly SingleScore[];
  /** The healthy system's per-reading log-likelihoods. */
  healthy: readonly number[];
  /** Readings outside their band on the healthy system. */
  symptoms: readonly number[];
  suspects: (reading: number) => readonly string[];
  /** Keys (refsKey) of candidates already scored; extended in place. */
  seen: Set<string>;
  score: (set: readonly ModeChoice[]) => Scored;
  refsKey: (refs: readonly FaultRef[]) => string;
}

export function extendByConflicts(input: ConflictInput, options: ConflictOptions = {}): { scored: Scored[]; pairs: number; triples: number; capped: boolean } {
  const nSeeds = options.seeds ?? 8;
  const nExt = options.extensions ?? 32;
  const points = options.points ?? 2;
  const nTriples = options.triples ?? 3;
  const nExt3 = options.tripleExtensions ?? 12;
  const fullSweep = options.fullSweep ?? 8;
  const deadline = performance.now() + (options.timeMs ?? 60_000);
  let capped = false;

  // supporters(r) and the best single posterior per part.
  const supporters = new Map<number, Set<string>>();
  const bestOfPart = new Map<string, number>();
  const singleOf = new Map<ModeChoice, SingleScore>();
  const byPart = new Map<string, SingleScore[]>();
  for (const x of input.singles) {
    singleOf.set(x.ch, x);
    const part = x.ch.ref.part;
    bestOfPart.set(part, Math.max(bestOfPart.get(part) ?? -Infinity, x.logPost));
    const list = byPart.get(part);
    if (list) list.push(x);
    else byPart.set(part, [x]);
    const h = heaviest(x.s);
    h.perReading.forEach((ll, r) => {
      if (ll - (input.healthy[r] as number) > SUPPORT_LLR) {
        let set = supporters.get(r);
        if (!set) supporters.set(r, (set = new Set()));
        set.add(part);
      }
    });
  }
  for (const list of byPart.values()) list.sort((a, b) => b.logPost - a.logPost);
  const conflictMemo = new Map<number, Set<string>>();
  const conflict = (r: number) => {
    let c = conflictMemo.get(r);
    if (!c) conflictMemo.set(r, (c = new Set([...input.suspects(r), ...(supporters.get(r) ?? [])])));
    return c;
  };

  /** Mode choices that extend a candidate (its parts excluded) towards hitting its residual conflicts. */
  const extensionsFor = (residual: readonly number[], exclude: ReadonlySet<string>, limit: number): ModeChoice[] => {
    const hits = new Map<string, number>();
    for (const r of residual) for (const p of conflict(r)) if (!exclude.has(p) && byPart.has(p)) hits.set(p, (hits.get(p) ?? 0) + 1);
    const parts = [...hits.keys()].sort(
      (a, b) => (hits.get(b) as number) - (hits.get(a) as number) || (bestOfPart.get(b) as number) - (bestOfPart.get(a) as number) || a.localeCompare(b),
    );
    const out: ModeChoice[] = [];
    for (const p of parts) {
      for (const x of byPart.get(p) as SingleScore[]) {
        if (out.length >= limit) return out;
        out.push(x.ch);
      }
    }
    return out;
  };
  const trunc = (ch: ModeChoice, keep: number) => {
    const single = singleOf.get(ch);
    return single ? truncatedChoice(ch, single.s.combos.map(comboLogWeight), keep) : ch;
  };

  // A mode that changes no reading alone has no "best" sweep points: it keeps them all.
  const invisible = (ch: ModeChoice) => {
    const single = singleOf.get(ch);
    return !!single && heaviest(single.s).perReading.every((ll, r) => Math.abs(ll - (input.healthy[r] as number)) < SUPPORT_LLR);
  };
  const scored: Scored[] = [];
  const generated: { members: ModeChoice[]; s: Scored; logPost: number }[] = [];
  const tryScore = (members: ModeChoice[]): Scored | undefined => {
    const key = input.refsKey(members.map((m) => m.ref));
    if (input.seen.has(key)) return undefined;
    if (performance.now() > deadline) {
      capped = true;
      return undefined;
    }
    input.seen.add(key);
    const sorted = [...members].sort((a, b) => a.ref.part.localeCompare(b.ref.part));
    const s = input.score(choiceSet(...sorted));
    scored.push(s);
    return s;
  };

  // Seeds: for each reading the healthy system leaves outside its band, the strongest single that explains it
  // (so every symptom gets its visible fault), then the strongest singles overall; all with a residual.
  const ranked = [...input.singles].sort((a, b) => b.logPost - a.logPost).filter((x) => heaviest(x.s).bad.length > 0);
  const seeds: SingleScore[] = [];
  const addSeed = (x: SingleScore | undefined) => {
    if (x && !seeds.includes(x) && seeds.length < nSeeds) seeds.push(x);
  };
  const support = (x: SingleScore, r: number) => (heaviest(x.s).perReading[r] as number) - (input.healthy[r] as number);
  for (const r of input.symptoms) {
    // The best support for r, and its twins (parts the readings cannot tell apart, e.g. capacitors on one rail).
    const top = ranked.filter((x) => support(x, r) > SUPPORT_LLR).sort((a, b) => support(b, r) - support(a, r));
    const best = top[0] ? support(top[0], r) : Infinity;
    for (const x of top.filter((y) => support(y, r) >= best - TWIN_NATS).slice(0, TWINS)) addSeed(x);
  }
  for (const x of ranked) addSeed(x);
  let pairs = 0;
  for (const seed of seeds) {
    const residual = heaviest(seed.s).bad;
    const a = trunc(seed.ch, points);
    const exts = extensionsFor(residual, new Set([seed.ch.ref.part]), nExt);
    for (let i = 0; i < exts.length; i++) {
      const ch = exts[i] as ModeChoice;
      // The extensions hitting most residual conflicts pair with the seed's whole sweep: the seed's best points
      // alone are rarely its best points beside a second fault.
      const s = tryScore([i < fullSweep ? seed.ch : a, invisible(ch) ? ch : trunc(ch, points)]);
      if (!s) continue;
      pairs++;
      generated.push({ members: [seed.ch, ch], s, logPost: s.logPrior + logMarginal(s) });
    }
  }

  // Twins: a generated pair that explains the readings also stands for the pairs with a member swapped for a
  // single the readings cannot tell from it (same evidence on every reading within TWIN_NATS): score those too,
  // so indistinguishable parts share the mass instead of one taking it all.
  const sameEvidence = (a: SingleScore, b: SingleScore) => {
    const pa = heaviest(a.s).perReading;
    const pb = heaviest(b.s).perReading;
    return pa.every((x, r) => Math.abs(x - (pb[r] as number)) < TWIN_NATS);
  };
  const strong = generated
    .filter((g) => heaviest(g.s).bad.length === 0)
    .sort((a, b) => b.logPost - a.logPost)
    .slice(0, nTriples);
  for (const g of strong) {
    for (let k = 0; k < g.members.length; k++) {
      const m = singleOf.get(g.members[k] as ModeChoice);
      if (!m) continue;
      const twins = input.singles.filter(
        (x) => x !== m && x.ch.ref.mode === m.ch.ref.mode && !g.members.some((y) => y.ref.part === x.ch.ref.part) && sameEvidence(m, x),
      );
      for (const t of twins.slice(0, 2 * TWINS)) {
        const members = g.members.map((y, j) => (j === k ? t.ch : y));
        const sc = tryScore(members.map((y) => (invisible(y) || y === t.ch ? y : trunc(y, points))));
        if (sc) pairs++;
      }
    }
  }

  let triples = 0;
  const pairSeeds = generated
    .filter((g) => heaviest(g.s).bad.length > 0)
    .sort((a, b) => b.logPost - a.logPost)
    .slice(0, nTriples);
  for (const g of pairSeeds) {
    const base = g.members.map((m) => trunc(m, 1));
    const exclude = new Set(g.members.map((m) => m.ref.part));
    for (const ch of extensionsFor(heaviest(g.s).bad, exclude, nExt3)) {
      if (tryScore([...base, trunc(ch, 1)])) triples++;
    }
  }
  return { scored, pairs, triples, capped };
}
