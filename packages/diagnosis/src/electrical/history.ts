/**
 * The shop's own failure history as prior adjustments.
 *
 * Which part failed on a board that came in is a categorical variable over the board's fault modes (part, mode).
 * The engine's defaults give its base measure: q_k = π_k / Σπ, the share of the failures the defaults expect in
 * mode k. Taking the defaults as a Dirichlet prior with α pseudo-counts (α q_k for mode k) and the shop's N
 * verified failures with n_k in mode k, the posterior mean share is (α q_k + n_k) / (α + N) — the conjugate
 * Dirichlet–multinomial update (Gelman et al., "Bayesian Data Analysis", 3rd ed., 2013, §3.4; from memory). One
 * part-mode's share is the Beta marginal of it, Beta(α q_k + n_k, α (1 − q_k) + N − n_k). The new prior of mode
 * k is π_k × posterior share / q_k, so the board's total fault prior is kept and only its spread moves.
 *
 * Weights (documented, from memory — no published figure for this trade):
 * - α = HISTORY_WEIGHT = 20: the defaults count as 20 verified boards; after 20 boards of a model the shop's own
 *   history weighs as much as the defaults.
 * - Per part kind across the shop's other board models: the same update over (kind, mode) categories with
 *   α = KIND_WEIGHT = 40 (another model's boards say less about this one), applied first as a factor on every part
 *   of that kind and mode; this board model's own history is applied after it, on the result.
 * A failure recorded without a mode (a part replaced, the mode unknown) is spread over the part's modes in
 * proportion to their priors (over a kind's modes evenly). Modes moved only by the renormalisation (the ones that
 * did not fail, each × α / (α + N)) carry no words.
 */
import type { PriorAdjustment } from '../core/priors.js';
import type { ElectricalPart } from './faults.js';
import type { PartKind } from './kinds.js';

export const HISTORY_WEIGHT = 20;
export const KIND_WEIGHT = 40;

export interface FailureCount<K extends string = string> {
  /** A part (netlist name or designator) for the board's own history; a part kind across models. */
  key: K;
  mode?: string;
  count: number;
}

export interface FailureHistory {
  /** Verified failures on this board model. `jobs`: how many verified jobs they come from. */
  board?: { jobs: number; failures: FailureCount[] };
  /** Verified failures on the shop's other board models, by part kind. */
  kinds?: { jobs: number; failures: FailureCount<PartKind>[] };
  /** Pseudo-counts of the defaults (default HISTORY_WEIGHT, and KIND_WEIGHT for kinds). */
  weight?: number;
  kindWeight?: number;
}

interface Category {
  /** Parts and modes the category holds, with their current priors. */
  members: { part: string; mode: string; prior: number }[];
  n: number;
}

/** The Dirichlet posterior's factor per category: (α q + n) / (α + N) / q. */
function factors(cats: Map<string, Category>, alpha: number): Map<string, number> {
  const total = [...cats.values()].reduce((s, c) => s + c.members.reduce((a, m) => a + m.prior, 0), 0);
  const N = [...cats.values()].reduce((s, c) => s + c.n, 0);
  const out = new Map<string, number>();
  if (total <= 0 || N <= 0) return out;
  for (const [k, c] of cats) {
    const q = c.members.reduce((a, m) => a + m.prior, 0) / total;
    if (q <= 0) continue;
    out.set(k, (alpha * q + c.n) / (alpha + N) / q);
  }
  return out;
}

/** Spreads counts without a mode over the modes in proportion to their priors. */
function spread(part: ElectricalPart, mode: string | undefined, count: number, priors: Map<string, number>): [string, number][] {
  if (mode !== undefined) return part.modes.some((m) => m.name === mode) ? [[mode, count]] : [];
  const modes = part.modes.map((m) => [m.name, priors.get(`${part.name}\u0000${m.name}`) ?? m.prior] as const);
  const sum = modes.reduce((s, [, p]) => s + p, 0);
  return sum > 0 ? modes.map(([m, p]) => [m, (count * p) / sum]) : [];
}

export interface HistoryWords {
  /** "C10 — shorted: 7 of the last 9 boards of this model" */
  board(part: string, mode: string, n: number, jobs: number): string;
  kind(part: string, mode: string, kind: PartKind, n: number, jobs: number): string;
}

/**
 * Prior adjustments from the history: kind factors first (source "history-kind"), then this model's own history
 * as replacement priors (source "history"). `resolve` maps a count's key to the part's netlist name.
 */
export function historyAdjustments(
  parts: readonly ElectricalPart[],
  h: FailureHistory,
  resolve: (key: string) => string | undefined,
  words: HistoryWords,
): PriorAdjustment[] {
  const out: PriorAdjustment[] = [];
  const priors = new Map<string, number>();
  for (const p of parts) for (const m of p.modes) priors.set(`${p.name}\u0000${m.name}`, m.prior);

  if (h.kinds && h.kinds.failures.length > 0) {
    const cats = new Map<string, Category>();
    for (const p of parts) {
      for (const m of p.modes) {
        const k = `${p.kind}\u0000${m.name}`;
        let c = cats.get(k);
        if (!c) cats.set(k, (c = { members: [], n: 0 }));
        c.members.push({ part: p.name, mode: m.name, prior: m.prior });
      }
    }
    for (const f of h.kinds.failures) {
      for (const [k, c] of cats) {
        const [kind, mode] = k.split('\u0000') as [string, string];
        if (kind === f.key && (f.mode === undefined || f.mode === mode))
          c.n += f.mode === undefined ? f.count / [...cats.keys()].filter((x) => x.startsWith(`${kind}\u0000`)).length : f.count;
      }
    }
    for (const [k, f] of factors(cats, h.kindWeight ?? KIND_WEIGHT)) {
      const c = cats.get(k) as Category;
      if (c.n <= 0 || Math.abs(f - 1) < 1e-9) continue;
      const [kind, mode] = k.split('\u0000') as [PartKind, string];
      for (const m of c.members) {
        out.push({ part: m.part, mode: m.mode, factor: f, source: 'history-kind', note: words.kind(m.part, mode, kind, c.n, h.kinds.jobs) });
        priors.set(`${m.part}\u0000${m.mode}`, m.prior * f);
      }
    }
  }

  if (h.board && h.board.failures.length > 0) {
    const byName = new Map(parts.map((p) => [p.name, p]));
    const n = new Map<string, number>();
    for (const f of h.board.failures) {
      const name = resolve(f.key);
      const part = name ? byName.get(name) : undefined;
      if (!part) continue;
      for (const [mode, c] of spread(part, f.mode, f.count, priors)) n.set(`${part.name}\u0000${mode}`, (n.get(`${part.name}\u0000${mode}`) ?? 0) + c);
    }
    const cats = new Map<string, Category>();
    for (const p of parts)
      for (const m of p.modes)
        cats.set(`${p.name}\u0000${m.name}`, {
          members: [{ part: p.name, mode: m.name, prior: priors.get(`${p.name}\u0000${m.name}`) ?? m.prior }],
          n: n.get(`${p.name}\u0000${m.name}`) ?? 0,
        });
    const fs = factors(cats, h.weight ?? HISTORY_WEIGHT);
    // Every mode moves (the ones that failed up, the others down a little); only the failed ones carry words.
    for (const [k, f] of fs) {
      const c = cats.get(k) as Category;
      const m = c.members[0] as Category['members'][number];
      if (Math.abs(f - 1) < 1e-9 || m.prior <= 0) continue;
      const failed = c.n > 0;
      out.push({
        part: m.part,
        mode: m.mode,
        prior: Math.min(0.5, m.prior * f),
        source: 'history',
        ...(failed ? { note: words.board(m.part, m.mode, c.n, h.board.jobs) } : {}),
      });
    }
  }
  return out;
}
