/**
 * Fault dictionary of a board: every single-fault prediction (each part × mode × sweep point) for every test the
 * board offers, computed once before the bench needs it ("simulation before test", the fault-dictionary approach
 * of analog test: Bandler & Salama, "Fault diagnosis of analog circuits", Proc. IEEE 73(8), 1985, §II; from
 * memory). At the bench an update is then arithmetic over stored numbers: the diagnoser's prediction cache reads
 * the dictionary before it would simulate (core/cache.ts `source`).
 *
 * Tests the board offers: each test point against its reference in every meter function in its power state
 * (nexttests.ts: DC V powered; Ω, continuity, diode both ways unpowered), plus, for the parts a technician would
 * lift to clear a rail that reads short (capacitors, diodes, transistors with a pin on a test point's net; common
 * practice), that part lifted with the probe on each of its nets.
 *
 * A prediction is stored as one float64: the reading (volts, ohms; a continuity prediction's beep follows from
 * the meter's threshold, as in the circuit package's meter), OL as +∞, "does not solve" as NaN, "AC mains, not
 * predicted" as −∞. Fault pairs are not in the dictionary at first: the readings ask for them, the diagnoser
 * marks them as being checked (a placeholder the scoring treats as unpredicted) and a background run adds them
 * (`takeWantedPairs`, `computePairs`, `addPairs`). The same holds for a single fault on a test outside the
 * dictionary (a part lifted that the rule above does not lift); the healthy board is always simulated at once.
 */
import type { MeterProfile } from '@splitscope/circuit';
import { subFaultKey } from '../core/cache.js';
import { modeChoices } from '../core/choices.js';
import type { SubFault } from '../core/types.js';
import type { Diagnoser } from './diagnoser.js';
import { FastPredictor } from './fast-predict.js';
import { testKey, type ElectricalModel, type ElectricalTest } from './model.js';
import { candidateTests, type PartNets } from './nexttests.js';
import type { MeterMode, Prediction } from './noise.js';

/** Changes whenever the stored layout or the test list rule changes (stored beside the engine version). */
export const DICTIONARY_FORMAT = 1;

export interface FaultDictionary {
  tests: ElectricalTest[];
  /** Column keys: '∅' (the healthy board) first, then every single sub-fault (core/cache.ts subFaultKey). */
  faults: string[];
  /** One row per test, aligned with `faults`. */
  rows: Float64Array[];
}

/** Predictions of one fault set for some tests (a background run's result, stored beside the dictionary). */
export interface PairColumn {
  key: string;
  testKeys: string[];
  values: Float64Array;
}

const LIFTED_KINDS = new Set(['ceramic-capacitor', 'electrolytic-capacitor', 'diode', 'led', 'bjt']);

/** The tests the board offers (see the header), in a stable order. */
export function dictionaryTests(d: Diagnoser): ElectricalTest[] {
  const points = d.testPoints ?? [];
  const railNets = new Set(points.map((p) => p.net));
  const lift: PartNets[] = d.model.parts
    .filter((p) => LIFTED_KINDS.has(p.kind) && p.nets.some((n) => railNets.has(n)))
    .map((p) => ({ name: p.name, nets: p.nets }));
  const tests = candidateTests({ points, cur: { power: 'off', lifted: [] }, liftParts: lift });
  return tests.filter((t) => d.model.nets.has(t.red) && d.model.nets.has(t.black));
}

/** Every single sub-fault, grouped by part (the unit of the progress count). */
export function singleFaultsByPart(model: ElectricalModel): SubFault[][] {
  const byPart = new Map<string, SubFault[]>();
  for (const ch of modeChoices(model.components)) {
    const list = byPart.get(ch.ref.part) ?? [];
    for (const s of ch.subs) list.push(s.sub);
    byPart.set(ch.ref.part, list);
  }
  return [...byPart.values()];
}

export function encodePrediction(p: Prediction): number {
  if (p.value === 'OL') return Infinity;
  if (p.value === 'unknown') return p.reason === 'ac-mains' ? -Infinity : NaN;
  return p.value;
}

export function decodePrediction(x: number, mode: MeterMode, meter: MeterProfile): Prediction {
  if (x === Infinity) return mode === 'continuity' ? { value: 'OL', beep: false } : { value: 'OL' };
  if (x === -Infinity) return { value: 'unknown', reason: 'ac-mains' };
  if (Number.isNaN(x)) return { value: 'unknown', reason: 'no-solve' };
  return mode === 'continuity' ? { value: x, beep: x < meter.continuity.threshold } : { value: x };
}

export interface BuildOptions {
  /** Called after each part with parts done and the total. */
  onProgress?: (done: number, total: number) => void;
  /**
   * Predicts one fault set on the tests (default: fast fault simulation from the healthy factors per test,
   * fast-predict.ts, which falls back to the board model's own solves where it does not apply).
   */
  predict?: (faults: readonly SubFault[], tests: readonly ElectricalTest[]) => Prediction[];
}

/** Computes the dictionary of a board (seconds of CPU: run it off the request path). */
export function buildDictionary(d: Diagnoser, options: BuildOptions = {}): FaultDictionary {
  const model = d.model;
  const tests = dictionaryTests(d);
  const groups = singleFaultsByPart(model);
  const faults = ['∅', ...groups.flatMap((g) => g.map((f) => subFaultKey([f])))];
  const rows = tests.map(() => new Float64Array(faults.length));
  tests.forEach((t, i) => ((rows[i] as Float64Array)[0] = encodePrediction(model.healthyPrediction(t))));
  const fast = options.predict ? undefined : new FastPredictor(model);
  const predict = options.predict ?? ((f, ts) => (fast as FastPredictor).predict(f, ts));
  let col = 1;
  groups.forEach((group, g) => {
    for (const f of group) {
      const preds = predict([f], tests);
      preds.forEach((p, i) => ((rows[i] as Float64Array)[col] = encodePrediction(p)));
      col++;
    }
    options.onProgress?.(g + 1, groups.length);
  });
  return { tests, faults, rows };
}

type Work = { faults: SubFault[]; tests: ElectricalTest[] };

/** Keys of (fault set, test) asked for and not yet delivered, per diagnoser. */
const inFlight = new WeakMap<Diagnoser, Map<string, Set<string>>>();

const PENDING: Prediction = Object.freeze({ value: 'unknown', reason: 'pending' }) as Prediction;

/**
 * Makes a diagnoser read its board's dictionary (and pair columns already computed) before it simulates; from
 * then on, fault pairs it lacks are marked as being checked instead of simulated while the bench waits.
 */
export function attachDictionary(d: Diagnoser, dict: FaultDictionary, pairs: readonly PairColumn[] = []): void {
  const model = d.model;
  const meter = model.meter;
  const rowOf = new Map(dict.tests.map((t, i) => [testKey(t), i]));
  const colOf = new Map(dict.faults.map((k, i) => [k, i]));
  dict.tests.forEach((t, i) => model.seedHealthy(t, decodePrediction((dict.rows[i] as Float64Array)[0] as number, t.mode, meter)));
  d.cache.source = (fk, tk) => {
    const r = rowOf.get(tk);
    const c = colOf.get(fk);
    if (r === undefined || c === undefined) return undefined;
    return decodePrediction((dict.rows[r] as Float64Array)[c] as number, tk.slice(0, tk.indexOf('|')) as MeterMode, meter);
  };
  // A part alone is simulated at once: its circuit is the part's own elements, a fraction of a millisecond each.
  d.cache.defer = { placeholder: PENDING, wanted: new Map(), now: (t) => t.alone !== undefined };
  inFlight.set(d, new Map());
  addPairs(d, pairs);
}

/**
 * After an update: the fault sets it marked as being checked, with the tests it asked them on, each (set, test)
 * returned once so that the caller computes it once.
 */
export function takeWantedPairs(d: Diagnoser): Work[] {
  const flying = inFlight.get(d);
  const wanted = d.cache.defer?.wanted;
  if (!flying || !wanted) return [];
  const out: Work[] = [];
  for (const [key, w] of wanted) {
    let f = flying.get(key);
    if (!f) flying.set(key, (f = new Set()));
    const fresh = [...w.tests].filter(([tk]) => !f.has(tk));
    for (const [tk] of fresh) f.add(tk);
    if (fresh.length > 0) out.push({ faults: w.faults, tests: fresh.map(([, t]) => t) });
  }
  wanted.clear();
  return out;
}

/** Predictions of fault sets on tests, as stored columns (what the background run computes). */
export function computePairs(d: Diagnoser, work: readonly Work[]): PairColumn[] {
  return work.map((w) => ({
    key: subFaultKey(w.faults),
    testKeys: w.tests.map(testKey),
    values: Float64Array.from(d.model.predict(w.faults, w.tests), encodePrediction),
  }));
}

/** Adds computed pair columns to a diagnoser's predictions; the next update scores those pairs in full. */
export function addPairs(d: Diagnoser, columns: readonly PairColumn[]): void {
  const flying = inFlight.get(d);
  const meter = d.model.meter;
  for (const c of columns) {
    const f = flying?.get(c.key);
    c.testKeys.forEach((tk, i) => {
      d.cache.put(c.key, tk, decodePrediction(c.values[i] as number, tk.slice(0, tk.indexOf('|')) as MeterMode, meter));
      f?.delete(tk);
    });
    if (f?.size === 0) flying?.delete(c.key);
  }
}

/** Fault-set keys still being checked (asked for and not yet delivered). */
export function checkingKeys(d: Diagnoser): ReadonlySet<string> {
  const keys = new Set<string>(d.cache.defer?.wanted.keys() ?? []);
  for (const k of inFlight.get(d)?.keys() ?? []) keys.add(k);
  return keys;
}

/** float64 little-endian bytes of a row or column (the stored form, see docs/decisions). */
export function toBytes(a: Float64Array): Uint8Array {
  const out = new Uint8Array(a.length * 8);
  const view = new DataView(out.buffer);
  a.forEach((x, i) => view.setFloat64(i * 8, x, true));
  return out;
}

export function fromBytes(b: Uint8Array): Float64Array {
  const view = new DataView(b.buffer, b.byteOffset, b.byteLength);
  const out = new Float64Array(b.byteLength / 8);
  for (let i = 0; i < out.length; i++) out[i] = view.getFloat64(i * 8, true);
  return out;
}
