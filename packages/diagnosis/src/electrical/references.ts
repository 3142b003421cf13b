/**
 * Known-good boards as evidence where the model is silent. A reading whose healthy value the model cannot compute
 * (a DC V on a mains net, a state the circuit does not solve in) is left out of scoring (see the README). When
 * the shop has measured the same point on at least MIN_REFERENCE_BOARDS known-good boards and the reading lies
 * within their band, the reading is evidence that the parts with a pin on the probed nets are sound: each of their
 * fault modes takes the likelihood ratio REFERENCE_OK_FACTOR on its odds (core/priors.ts, the odds form of Bayes'
 * rule). A reading outside the reference band says nothing here (the model, not the references, names faults).
 *
 * REFERENCE_OK_FACTOR = 0.25, from memory: a part fault that leaves its own net's reading where good boards read it
 * is about four times less likely than a sound part doing so (the fault could still hide behind the reading).
 */
import type { PriorAdjustment } from '../core/priors.js';
import type { ElectricalModel, ElectricalTest } from './model.js';
import { isPredicted, type ReadingValue } from './noise.js';

export const REFERENCE_OK_FACTOR = 0.25;
export const MIN_REFERENCE_BOARDS = 2;

/** A point's band measured on known-good boards (nets as the netlist names them). */
export interface ReferenceBand {
  mode: ElectricalTest['mode'];
  red: string;
  black: string;
  power: 'on' | 'off';
  low: number;
  high: number;
  /** How many known-good boards the band comes from. */
  boards: number;
}

export function referenceAdjustments(
  model: ElectricalModel,
  obs: readonly { test: ElectricalTest; value: ReadingValue }[],
  bands: readonly ReferenceBand[],
  words: (test: ElectricalTest, value: number, band: ReferenceBand) => string,
): PriorAdjustment[] {
  const out: PriorAdjustment[] = [];
  for (const o of obs) {
    if (o.test.lifted.length > 0 || typeof o.value !== 'number') continue;
    if (isPredicted(model.healthyPrediction(o.test))) continue;
    const band = bands.find(
      (b) => b.mode === o.test.mode && b.power === o.test.power && b.red.toLowerCase() === o.test.red && b.black.toLowerCase() === o.test.black,
    );
    if (!band || band.boards < MIN_REFERENCE_BOARDS || o.value < band.low || o.value > band.high) continue;
    // Ground touches nearly every part: only the probed signal nets speak for their parts.
    const parts = new Set([o.test.red, o.test.black].filter((n) => n !== '0').flatMap((n) => model.partsOn(n)));
    const note = words(o.test, o.value, band);
    for (const part of parts)
      if ((model.partsByName.get(part)?.modes.length ?? 0) > 0) out.push({ part, factor: REFERENCE_OK_FACTOR, source: 'reference', note });
  }
  return out;
}
