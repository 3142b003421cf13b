/**
 * Per-job prior adjustments: what a job knows before any reading (the fault code the unit showed, the shop's own
 * failure history of this board model, readings that agree with a known-good board) moves the fault-mode priors
 * of some parts. The board's engine (its model, its prediction cache) is built once per board; an adjustment only
 * changes the mode choices' prior terms for one update, so nothing is simulated again.
 *
 * Two kinds of step, applied in the order given:
 * - `factor`: a likelihood ratio on the mode's odds (the odds form of Bayes' rule, posterior odds = likelihood
 *   ratio × prior odds; Pearl 1988, "Probabilistic Reasoning in Intelligent Systems", §2.1.2, from memory):
 *   p' = f·p / (1 − p + f·p). A factor above 1 raises the mode, below 1 lowers it, and p' stays in (0, 1).
 * - `prior`: a replacement prior (a posterior mean computed elsewhere, e.g. from the shop's history).
 * When a part's fault priors would sum to 1 or more they are scaled to sum to MAX_FAULT_SUM, so the part keeps
 * an "ok" mode.
 *
 * Every change is reported per part and mode with each step's source and words, so a screen can say which
 * source moved which prior and by how much.
 */
import type { ModeChoice } from './choices.js';
import { modeChoices } from './choices.js';
import type { Component } from './types.js';

export interface PriorAdjustment {
  /** Component (part) name as the model names it. */
  part: string;
  /** Fault mode; absent: every fault mode of the part. */
  mode?: string;
  /** Likelihood ratio applied to the mode's prior odds. */
  factor?: number;
  /** Replacement prior probability of the mode, in [0, 1). */
  prior?: number;
  /** Where the adjustment comes from, for programs ("fault-code", "history", "reference"). */
  source: string;
  /** Why, in words ("fault code F7 points at the fan switch"). */
  note?: string;
}

export interface PriorStep {
  source: string;
  note?: string;
  factor?: number;
  prior?: number;
  before: number;
  after: number;
}

export interface PriorChange {
  part: string;
  mode: string;
  /** The board's own prior. */
  before: number;
  /** The prior the update used. */
  after: number;
  steps: PriorStep[];
}

/** Upper bound on a part's summed fault priors after adjustment (its "ok" prior stays at least 1 − this). */
export const MAX_FAULT_SUM = 0.9;

export class PriorAdjustmentError extends Error {}

function checkAdjustment(a: PriorAdjustment, i: number, components: ReadonlyMap<string, Component>): void {
  const c = components.get(a.part);
  if (!c) throw new PriorAdjustmentError(`prior adjustment ${i}: unknown part ${a.part}`);
  if (a.mode !== undefined && !c.modes.some((m) => m.name === a.mode)) throw new PriorAdjustmentError(`prior adjustment ${i}: ${a.part} has no mode ${a.mode}`);
  if ((a.factor === undefined) === (a.prior === undefined)) throw new PriorAdjustmentError(`prior adjustment ${i}: give exactly one of factor or prior`);
  if (a.factor !== undefined && !(Number.isFinite(a.factor) && a.factor > 0))
    throw new PriorAdjustmentError(`prior adjustment ${i}: factor must be a positive number`);
  if (a.prior !== undefined && !(Number.isFinite(a.prior) && a.prior >= 0 && a.prior < 1))
    throw new PriorAdjustmentError(`prior adjustment ${i}: prior must be in [0, 1)`);
}

/** p after a likelihood ratio f on its odds. */
export const oddsUpdate = (p: number, f: number): number => (p <= 0 ? 0 : (f * p) / (1 - p + f * p));

/** The components with their adjusted mode priors (untouched components are the same objects) and the changes. */
export function adjustComponents(
  components: readonly Component[],
  adjustments: readonly PriorAdjustment[],
): { components: Component[]; changes: PriorChange[] } {
  const byName = new Map(components.map((c) => [c.name, c]));
  adjustments.forEach((a, i) => checkAdjustment(a, i, byName));
  const touched = new Map<string, Map<string, PriorChange>>();
  for (const a of adjustments) {
    const c = byName.get(a.part) as Component;
    let modes = touched.get(c.name);
    if (!modes) {
      modes = new Map(c.modes.map((m) => [m.name, { part: c.name, mode: m.name, before: m.prior, after: m.prior, steps: [] as PriorStep[] }]));
      touched.set(c.name, modes);
    }
    for (const ch of modes.values()) {
      if (a.mode !== undefined && ch.mode !== a.mode) continue;
      const before = ch.after;
      const after = a.prior !== undefined ? a.prior : oddsUpdate(before, a.factor as number);
      ch.after = after;
      ch.steps.push({
        source: a.source,
        ...(a.note ? { note: a.note } : {}),
        ...(a.factor !== undefined ? { factor: a.factor } : {}),
        ...(a.prior !== undefined ? { prior: a.prior } : {}),
        before,
        after,
      });
    }
  }
  const changes: PriorChange[] = [];
  const out = components.map((c) => {
    const modes = touched.get(c.name);
    if (!modes) return c;
    const sum = [...modes.values()].reduce((s, m) => s + m.after, 0);
    if (sum > MAX_FAULT_SUM) for (const m of modes.values()) m.after *= MAX_FAULT_SUM / sum;
    for (const m of modes.values()) if (m.steps.length > 0) changes.push(m);
    return { ...c, modes: c.modes.map((m) => ({ ...m, prior: (modes.get(m.name) as PriorChange).after })) };
  });
  return { components: out, changes };
}

const memo = new WeakMap<object, Map<string, { choices: ModeChoice[]; changes: PriorChange[] }>>();
const MEMO_PER_MODEL = 16;

/**
 * The model's mode choices under the adjustments: the unadjusted choices (the same objects, so the engine's
 * memos keep hitting) for untouched parts, new ones for adjusted parts. Memoised per model and adjustment set.
 */
export function adjustedChoices(
  model: { components: readonly Component[] },
  base: readonly ModeChoice[],
  adjustments: readonly PriorAdjustment[],
): { choices: ModeChoice[]; changes: PriorChange[] } {
  if (adjustments.length === 0) return { choices: [...base], changes: [] };
  const key = JSON.stringify(adjustments.map((a) => [a.part, a.mode ?? '', a.factor ?? null, a.prior ?? null, a.source, a.note ?? '']));
  let perModel = memo.get(model);
  if (!perModel) memo.set(model, (perModel = new Map()));
  const hit = perModel.get(key);
  if (hit) return hit;
  const { components, changes } = adjustComponents(model.components, adjustments);
  const changed = new Set(changes.map((c) => c.part));
  const fresh = new Map<string, ModeChoice>();
  for (const ch of modeChoices(components.filter((c) => changed.has(c.name)))) fresh.set(`${ch.ref.part}\u0000${ch.ref.mode}`, ch);
  const choices: ModeChoice[] = [];
  for (const ch of base) {
    if (!changed.has(ch.ref.part)) choices.push(ch);
    else {
      const f = fresh.get(`${ch.ref.part}\u0000${ch.ref.mode}`);
      if (f) choices.push(f);
    }
  }
  // A mode whose board prior was 0 has no base choice; an adjustment that raised it adds one.
  for (const [k, f] of fresh) if (!base.some((b) => `${b.ref.part}\u0000${b.ref.mode}` === k)) choices.push(f);
  const result = { choices, changes };
  if (perModel.size >= MEMO_PER_MODEL) perModel.delete(perModel.keys().next().value as string);
  perModel.set(key, result);
  return result;
}
