/**
 * Joins what the server sent (expected-readings table, readings with their verdicts, the engine's diagnosis) to the
 * drawable board. Only lookups and labels: verdicts, bands, probabilities and next tests are the engine's.
 */
import { boardWords, type Diagnosis, type ExpectedReadingRow, type StoredReading } from '@splitscope/contract';
import type { MarkerState } from '@/lib/map-geometry';
import { METER_LABEL, meterText, readingText, verdictWord } from '@/lib/format';
import type { NextTestView, RankedPart } from '../components/ranking-panel';
import { netOf, type BoardView } from '@/lib/board/board-view';

export interface Target {
  mode: ExpectedReadingRow['mode'];
  red: string;
  black: string;
  power: 'on' | 'off';
  lifted: string[];
  /** A lifted part measured on its own pins (its netlist element); red and black are its pins' nets. */
  alone?: string | null;
}

const norm = (s: string) => s.trim().toLowerCase();
const sameProbe = (view: BoardView, a: string, b: string) => norm(netOf(view, a)) === norm(netOf(view, b));

export const stateOf = (verdict: 'ok' | 'low' | 'high' | null | undefined): MarkerState =>
  verdict === 'ok' ? 'healthy' : verdict === 'low' ? 'low' : verdict === 'high' ? 'high' : 'unmeasured';

export function sameTarget(view: BoardView, a: Target, b: Target) {
  return (
    a.mode === b.mode &&
    a.power === b.power &&
    sameProbe(view, a.red, b.red) &&
    sameProbe(view, a.black, b.black) &&
    [...a.lifted].sort().join() === [...b.lifted].sort().join() &&
    (a.alone ?? null) === (b.alone ?? null)
  );
}

export const currentReadings = (items: StoredReading[], phase: 'diagnosis' | 'verification' = 'diagnosis') =>
  items.filter((r) => !r.supersededBy && r.phase === phase);

/** The newest reading of this test, if any. */
export function latestFor(view: BoardView, readings: StoredReading[], t: Target): StoredReading | undefined {
  return [...readings].reverse().find((r) => sameTarget(view, { ...r, red: r.redNet, black: r.blackNet }, t));
}

/**
 * A point's marker: the verdict of the newest reading with the red probe on its net, taken in the board's
 * present state (the same parts lifted): a value read with C10 lifted says nothing about the board as built.
 */
export function pointState(
  view: BoardView,
  readings: StoredReading[],
  pointNet: string,
  lifted: readonly string[] = [],
): { state: MarkerState; reading?: StoredReading } {
  const same = [...lifted].sort().join();
  // A part measured on its own pins is off the board: its reading says nothing about the point its pad is on.
  const r = [...readings].reverse().find((x) => !x.alone && norm(x.redNet) === norm(pointNet) && [...x.lifted].sort().join() === same);
  return { state: r ? stateOf(r.verdict?.verdict) : 'unmeasured', reading: r };
}

/** The rows of the expected table that put the red probe on this point. */
export function rowsForPoint(view: BoardView, rows: ExpectedReadingRow[], pointId: string): ExpectedReadingRow[] {
  const p = view.pointOf(pointId);
  if (!p) return [];
  return rows.filter((r) => norm(r.red) === norm(p.id) || norm(netOf(view, r.red)) === norm(p.net));
}

export function expectedFor(view: BoardView, rows: ExpectedReadingRow[], t: Target): ExpectedReadingRow | undefined {
  return rows.find((r) => sameTarget(view, r, t));
}

export function describeTest(view: BoardView, t: Target & { value?: number | 'OL'; unit?: string }) {
  return `${view.netLabel(t.red)} to ${view.netLabel(t.black)}, ${METER_LABEL[t.mode]}, ${t.power === 'on' ? 'powered' : 'unplugged'}${t.lifted.length ? `, ${t.lifted.join(', ')} lifted` : ''}`;
}

const rec = (v: unknown): Record<string, unknown> => (typeof v === 'object' && v !== null ? (v as Record<string, unknown>) : {});

/** Parts ranked by the engine, each with the readings that speak for and against it. */
export function rankedParts(view: BoardView, d: Diagnosis): RankedPart[] {
  const words = boardWords(view.model);
  const evidenceText = (i: number): string => {
    const r = d.readings[i];
    if (!r) return `reading ${i + 1}`;
    const value = r.mode === 'continuity' ? readingText({ ...r, beep: null }) : meterText(r.value, r.unit);
    const verdict = r.verdict ? ` (${verdictWord(r.verdict)})` : '';
    // "C10 alone, Ω: 2 Ω": the part off the board on its own pins.
    if (r.alone) return `${words.probes(r)}, ${METER_LABEL[r.mode]}: ${value}${verdict}`;
    const lifted = r.lifted.length ? `, ${r.lifted.map(words.designator).join(', ')} lifted` : '';
    return `${view.netLabel(r.red)} ${value}${lifted}${verdict}`;
  };
  return d.parts.map((p) => {
    const single = d.candidates.find((c) => c.faults.length === 1 && c.faults[0]!.part === p.part && c.faults[0]!.mode === p.mode);
    const ev = Array.isArray(rec(single).evidence) ? (rec(single).evidence as unknown[]).map(rec) : [];
    const idx = (e: Record<string, unknown>) => (typeof e.reading === 'number' ? e.reading : typeof e.index === 'number' ? e.index : -1);
    const sign = (e: Record<string, unknown>) => e.effect ?? e.sign;
    const partRec = rec(p);
    return {
      part: p.part,
      label: p.label ?? p.part,
      designator: p.designator ?? p.part,
      mode: p.mode,
      probability: p.probability,
      description: typeof partRec.description === 'string' ? partRec.description : undefined,
      evidenceFor: ev.filter((e) => sign(e) === 'supports').map((e) => evidenceText(idx(e))),
      evidenceAgainst: ev.filter((e) => sign(e) === 'against').map((e) => evidenceText(idx(e))),
      // Pairs with this fault still being checked: its share may still move when they arrive.
      checking: d.candidates.some((c) => c.checking && c.faults.some((f) => f.part === p.part && f.mode === p.mode)),
    };
  });
}

export function nextTests(view: BoardView, d: Diagnosis): (NextTestView & { target: Target })[] {
  return d.nextTests.map((t, i) => {
    const r = rec(t);
    const target: Target = { mode: t.mode, red: t.red, black: t.black, power: t.power, lifted: t.lifted };
    const gain = typeof r.expectedGain === 'number' ? r.expectedGain : undefined;
    return {
      id: `${i}-${t.mode}-${t.red}-${t.black}-${t.power}`,
      label: t.instruction,
      meter: METER_LABEL[t.mode]!,
      power: t.power,
      red: t.red,
      black: t.black,
      gainBits: gain,
      pointId: view.pointOf(t.red)?.id,
      target,
    };
  });
}

/** Why priors moved on this job, one line per reason, as the engine words them (this job's evidence first). */
export function priorNotes(d: Diagnosis): { text: string; parts: string[]; source: string }[] {
  return d.priorNotes ?? [];
}

/** The board's sections by the summed probability of their parts' faults (what to suspect before any reading). */
export function sectionShares(view: BoardView, d: Diagnosis, top = 4): { name: string; share: number }[] {
  const sectionOf = new Map(view.parts.map((p) => [p.id, p.section]));
  const byId = new Map<string, number>();
  for (const p of d.parts) {
    const s = sectionOf.get(p.designator ?? p.part);
    if (s) byId.set(s, (byId.get(s) ?? 0) + p.probability);
  }
  const total = [...byId.values()].reduce((a, b) => a + b, 0) || 1;
  return [...byId.entries()]
    .map(([id, v]) => ({ name: view.sections.find((x) => x.id === id)?.name ?? id, share: v / total }))
    .sort((a, b) => b.share - a.share)
    .slice(0, top);
}
