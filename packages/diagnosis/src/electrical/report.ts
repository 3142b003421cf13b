/**
 * The words around a posterior: candidate and part names as printed, readings named by their probe points, the
 * "not explained" verdict and per-reading notes.
 *
 * "Not explained" rule (documented, the engine's answer when nothing modelled fits):
 *   the readings are reported as not explained when
 *   (a) no scored candidate (no fault, singles, pairs, triples) puts every reading within its band — the list of
 *       minimal diagnoses is empty — or
 *   (b) the unmodelled-fault hypothesis (engine.ts: a broad alternative against the noise model, a likelihood
 *       ratio test with prior odds 1:19) holds at least UNEXPLAINED_P of the posterior.
 *   The readings named are those outside their band under the best modelled candidate (its heaviest sweep
 *   combination); when it has none, those with the lowest likelihood under it. Confidence is lowered by the
 *   posterior itself: every modelled candidate's probability is scaled by 1 − P(unmodelled), so "no fault" is
 *   never rewarded for readings it cannot explain.
 */
import type { Element } from '@splitscope/circuit';
import type { Posterior, ScoredCandidate } from '../core/types.js';
import type { ElectricalPart } from './faults.js';
import type { ElectricalModel, ElectricalTest } from './model.js';
import type { Prediction } from './noise.js';
import { KIND_WORDS, METER_FUNCTION, modeWords, type ProbePoint } from './words.js';

export const UNEXPLAINED_P = 0.2;

export interface FaultWords {
  part: string;
  mode: string;
  /** As printed on the board (U1, C10). */
  designator: string;
  /** "opto", "transistor", "capacitor", "regulator". */
  kind: string;
  /** The mode in words ("LED open", "shorted"). */
  words: string;
  /** "U1 opto — LED open". */
  text: string;
}

export interface Namer {
  designator(part: string): string;
  point(net: string): ProbePoint;
  elementKind(flatName: string | undefined): Element['kind'] | undefined;
}

/** Words of one fault; `value` is the sweep point the readings favour. */
export function faultWords(model: ElectricalModel, names: Namer, part: string, mode: string, value?: number): FaultWords {
  const p = model.partsByName.get(part) as ElectricalPart;
  const m = p?.modes.find((x) => x.name === mode);
  const designator = names.designator(part);
  const kind = p ? KIND_WORDS[p.kind] : 'part';
  const words = p && m ? modeWords(p, m, names.elementKind(m.target), value) : mode;
  return { part, mode, designator, kind, words, text: `${designator} ${kind} — ${words}` };
}

/** Words of a candidate: its faults at the sweep point of its heaviest combination. */
export function candidateWords(model: ElectricalModel, names: Namer, c: ScoredCandidate): { text: string; faults: FaultWords[] } {
  if (c.faults.length === 0) return { text: 'no fault found', faults: [] };
  let best = c.combos[0];
  for (const k of c.combos) if (best && k.weight > best.weight) best = k;
  const faults = c.faults.map((f) => {
    const sub = best?.faults.find((s) => s.component === f.part && s.mode === f.mode);
    return faultWords(model, names, f.part, f.mode, sub?.value);
  });
  return { text: faults.map((f) => f.text).join(' + '), faults };
}

/** "DC V at TP1 against C1 −" */
export function readingPlace(test: ElectricalTest, names: Namer): string {
  const lifted = test.lifted.length > 0 ? ` with ${test.lifted.map((p) => names.designator(p)).join(', ')} lifted` : '';
  return `${METER_FUNCTION[test.mode]} at ${names.point(test.red).label} against ${names.point(test.black).label}${lifted}`;
}

export function unpredictedNote(p: Prediction): string {
  return p.reason === 'ac-mains'
    ? 'expected value not computed: this net carries AC mains, which the DC model cannot predict (not scored)'
    : 'expected value could not be computed in this board state (the model does not solve there); the reading is not scored';
}

export interface Unexplained {
  /** Indices of the readings that disagree. */
  readings: number[];
  message: string;
  /** Posterior probability of a fault the model does not hold. */
  probability: number;
}

/**
 * The "not explained" verdict (see the header), or undefined. `groupOf[i]` maps reading i to its observation
 * (repeats share one).
 */
export function unexplainedOf(
  post: Posterior,
  groupOf: readonly number[],
  tests: readonly ElectricalTest[],
  names: Namer,
  values: readonly string[],
): Unexplained | undefined {
  const pU = post.unmodelled?.probability ?? 0;
  const best = post.candidates[0];
  if (!best) return undefined;
  if (post.minimalDiagnoses.length > 0 && pU < UNEXPLAINED_P) return undefined;
  let groups = best.disagree;
  if (groups.length === 0) {
    const worst = [...best.evidence].sort((a, b) => a.llr - b.llr)[0];
    groups = worst && worst.llr < 0 ? [worst.index] : [];
  }
  const readings = groupOf.map((g, i) => (groups.includes(g) ? i : -1)).filter((i) => i >= 0);
  const first = readings[0];
  const where = [...new Set(readings.map((i) => `${readingPlace(tests[i] as ElectricalTest, names)} (${values[i]})`))];
  const around = first === undefined ? '' : names.point((tests[first] as ElectricalTest).red).label;
  const lead = best.faults.length === 0 ? 'No modelled fault explains these readings' : 'Even the likeliest modelled fault leaves readings unexplained';
  const message =
    `${lead}: ${where.join('; ') || 'the readings as a whole'}. Something the model does not cover` +
    (around ? `: check the parts around ${around} by eye and by substitution, and re-take the reading to rule out a slipped probe.` : '.');
  return { readings, message, probability: pU };
}
