/**
 * Why the priors moved, one line per reason, in the bench's words. A reason that moves many parts at once (the
 * shop's history of a part kind on its other models, a known-good reference) names the few parts it moves most and
 * counts the rest by kind ("R12, R7, R3 and 27 other resistors"): a technician scans a list of three designators,
 * not thirty (common practice: a work sheet names the likely parts and summarises the rest). Lines run from this
 * job's own evidence (its fault code, known-good references) to this model's history, then other models'.
 */
import type { PriorReport } from './case.js';

export interface PriorNote {
  /** "fault-code", "reference", "history" or "history-kind" (core/priors.ts `PriorAdjustment.source`). */
  source: string;
  /** The line as the bench shows it. */
  text: string;
  /** Every part the reason moves, by designator, most moved first. */
  parts: string[];
}

/** Designators named before the rest are counted. */
export const NAMED_PARTS = 3;

const ORDER = ['fault-code', 'reference', 'history', 'history-kind'];
const rank = (source: string) => (ORDER.includes(source) ? ORDER.indexOf(source) : ORDER.length);

const pct = (x: number) => `${(x * 100).toFixed(x < 0.01 ? 2 : 1)} %`;

/** "capacitor" → "capacitors"; a mixed rest is "parts". */
const plural = (word: string) => (word.endsWith('s') ? word : `${word}s`);

/** The parts a reason moves: all of them when few, else the first NAMED_PARTS and the rest counted by kind. */
export function namedParts(parts: readonly { designator: string; kind: string }[]): string {
  const names = parts.map((p) => p.designator);
  if (names.length <= NAMED_PARTS + 1) return names.length <= 1 ? (names[0] ?? '') : `${names.slice(0, -1).join(', ')} and ${names.at(-1)}`;
  const rest = parts.slice(NAMED_PARTS);
  const kinds = new Set(rest.map((p) => p.kind));
  const what = kinds.size === 1 ? plural([...kinds][0] as string) : 'parts';
  return `${names.slice(0, NAMED_PARTS).join(', ')} and ${rest.length} other ${what}`;
}

export function priorNotes(priors: readonly PriorReport[]): PriorNote[] {
  const groups = new Map<string, { source: string; note: string; span: string; parts: { designator: string; kind: string; after: number }[] }>();
  for (const p of priors) {
    const { designator, kind } = p.words;
    for (const s of p.steps) {
      if (!s.note) continue;
      const span = s.source === 'fault-code' ? '' : ` (prior ${pct(s.before)} → ${pct(s.after)})`;
      const key = `${s.source}\u0000${s.note}\u0000${span}`;
      let g = groups.get(key);
      if (!g) groups.set(key, (g = { source: s.source, note: s.note, span, parts: [] }));
      const seen = g.parts.find((x) => x.designator === designator);
      if (seen) seen.after = Math.max(seen.after, s.after);
      else g.parts.push({ designator, kind, after: s.after });
    }
  }
  const natural = new Intl.Collator('en', { numeric: true });
  return [...groups.values()]
    .map((g) => {
      const parts = [...g.parts].sort((a, b) => b.after - a.after || natural.compare(a.designator, b.designator));
      // A fault code's section is listed whole: the code points at those parts, and a section is a dozen at most.
      const names = g.source === 'fault-code' ? parts.map((p) => p.designator).join(', ') : namedParts(parts);
      // A part's own history names the part in its note; a reason shared by parts names them beside it.
      const text =
        g.source === 'history-kind'
          ? `${names}: ${g.note}${g.span}`
          : parts.length > 1 || g.source === 'fault-code' || g.source === 'reference'
            ? `${g.note} — ${names}${g.span}`
            : `${g.note}${g.span}`;
      return { source: g.source, text, parts: parts.map((p) => p.designator) };
    })
    .sort((a, b) => rank(a.source) - rank(b.source));
}
