/**
 * Mode choices (a component in one fault mode, its sweep expanded to sub-faults) and the sweep combinations of a
 * candidate (a set of mode choices). Combinations do not depend on the readings, so they are enumerated once per
 * choice set; choice sets are stable objects (memoised by member identity) so that memo hits across updates.
 */
import { subFaultKey } from './cache.js';
import type { Component, FaultRef, SubFault } from './types.js';

/** A mode-level fault with its sweep expanded to sub-faults, and its prior relative to ok. */
export interface ModeChoice {
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

export interface ComboTemplate {
  faults: SubFault[];
  logShare: number;
  key: string;
}

const comboMemo = new WeakMap<readonly ModeChoice[], ComboTemplate[]>();

/** Cartesian product of the members' sweep points (memoised per choice set). */
export function enumerateCombos(choices: readonly ModeChoice[]): ComboTemplate[] {
  const memo = comboMemo.get(choices);
  if (memo) return memo;
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

// Identity numbers of choice objects, so a choice set is memoised by its members' identities.
const ids = new WeakMap<ModeChoice, number>();
let nextId = 1;
const idOf = (c: ModeChoice) => {
  let i = ids.get(c);
  if (i === undefined) {
    i = nextId++;
    ids.set(c, i);
  }
  return i;
};
const setMemo = new Map<string, WeakRef<readonly ModeChoice[]>>();
export const EMPTY_CHOICES: readonly ModeChoice[] = [];

/** A stable array object per ordered set of mode choices. */
export function choiceSet(...members: ModeChoice[]): readonly ModeChoice[] {
  if (members.length === 0) return EMPTY_CHOICES;
  const k = members.map(idOf).join(',');
  const hit = setMemo.get(k)?.deref();
  if (hit) return hit;
  const arr: readonly ModeChoice[] = members;
  setMemo.set(k, new WeakRef(arr));
  return arr;
}

const choicesMemo = new WeakMap<object, ModeChoice[]>();
/** Mode choices per model (stable objects, so the memos above hit). */
export function choicesOf(model: { components: readonly Component[] }): ModeChoice[] {
  let c = choicesMemo.get(model);
  if (!c) {
    c = modeChoices(model.components);
    choicesMemo.set(model, c);
  }
  return c;
}

const truncMemo = new WeakMap<ModeChoice, Map<string, ModeChoice>>();

/**
 * The choice with only `keep` of its sweep points: those with the highest single-fault weight (ln share + ln
 * likelihood of the readings, `weights` in sub order). The dropped points' prior share is dropped with them.
 */
export function truncatedChoice(ch: ModeChoice, weights: readonly number[], keep: number): ModeChoice {
  if (ch.subs.length <= keep) return ch;
  const ranked = weights
    .map((w, i) => ({ i, w }))
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
