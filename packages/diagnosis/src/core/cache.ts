/**
 * Prediction cache of the diagnosis core: predictions per (sub-fault set, test). Predictions never depend on
 * readings, so a cache built for one set of readings serves every later update on the same model.
 */
import type { SubFault, SystemModel } from './types.js';

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
  /**
   * Stored predictions consulted before the model is asked (a fault dictionary, electrical/dictionary.ts):
   * (fault-set key, test key) → prediction, or undefined when the store does not hold it.
   */
  source?: (faultKey: string, testKey: string) => P | undefined;
  /**
   * Fault sets the store does not hold (pairs; single faults on a test outside it) are answered with
   * `placeholder` (a prediction `predicted()` says no to, so the reading counts as neutral for that candidate)
   * and listed in `wanted` for a background run, instead of being simulated while the caller waits. The healthy
   * board is always simulated. Absent: everything is simulated at once. `now` names tests cheap enough to
   * simulate while the caller waits (a lifted part on its own pins is a handful of elements).
   */
  defer?: { placeholder: P; wanted: Map<string, { faults: SubFault[]; tests: Map<string, T> }>; now?: (test: T) => boolean };
  constructor(private readonly model: SystemModel<T, unknown, P>) {}

  /** Store a prediction computed elsewhere (a background run). */
  put(faultKey: string, testKey: string, p: P): void {
    let inner = this.map.get(faultKey);
    if (!inner) this.map.set(faultKey, (inner = new Map()));
    inner.set(testKey, p);
  }

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
      let p = inner.get(k);
      if (p === undefined && this.source) {
        p = this.source(fk, k);
        if (p !== undefined) inner.set(k, p);
      }
      if (p === undefined && this.defer && faults.length > 0 && !this.defer.now?.(t)) {
        let w = this.defer.wanted.get(fk);
        if (!w) this.defer.wanted.set(fk, (w = { faults: faults.slice(), tests: new Map() }));
        w.tests.set(k, t);
        out[i] = this.defer.placeholder;
      } else if (p === undefined) {
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
