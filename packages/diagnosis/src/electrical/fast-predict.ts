/**
 * Single-fault predictions for the fault dictionary through fast fault simulation (@splitscope/circuit
 * fault-meter.ts, fault-sim.ts; docs/decisions/0006): per test, the healthy board in the test's state with the
 * meter attached is factored once, and every fault that is a conductance change (rubber stamps) is read from those
 * factors. The prediction is the one the board model gives (model.ts `predict`): the same meter logic, the same
 * "does not solve" and AC-mains rules. Faults that are not stamps (a junction opened, an IC dead, a source scaled,
 * a regulator moved to an inner node) and tests on a part alone are solved in full by the model.
 */
import { FaultMeter, rubberStamps, type RubberStamp } from '@splitscope/circuit';
import { subFaultKey } from '../core/cache.js';
import type { SubFault } from '../core/types.js';
import { applyFaults } from './faults.js';
import { isSolveFailure, toPrediction } from './meter.js';
import { stateKey, testKey, type ElectricalModel, type ElectricalTest } from './model.js';
import type { Prediction } from './noise.js';

/** How the build's predictions were made (printed by the dictionary benchmark). */
export interface FastCounts {
  /** Read from the healthy factors (Woodbury, Newton–Woodbury on boards with junctions). */
  fast: number;
  /** Stamps, but fault-sim fell back to a full solve (rank too high, Newton did not settle, an island). */
  fallback: number;
  /** Not stamps, a part alone, or the healthy board with the meter does not solve: the model's own full solve. */
  full: number;
}

export class FastPredictor {
  readonly counts: FastCounts = { fast: 0, fallback: 0, full: 0 };
  private readonly meters = new Map<string, FaultMeter | null>();
  /** Stamps of the fault set being predicted, by state (the build goes fault by fault). */
  private readonly stamps = new Map<string, RubberStamp[] | null>();
  private stampsOf = '';

  constructor(private readonly model: ElectricalModel) {}

  predict(faults: readonly SubFault[], tests: readonly ElectricalTest[]): Prediction[] {
    return tests.map((t) => this.one(faults, t));
  }

  private one(faults: readonly SubFault[], t: ElectricalTest): Prediction {
    const { model } = this;
    const ac = t.mode === 'dcv' && (model.hazards.ac.has(t.red) || model.hazards.ac.has(t.black));
    const stamps = t.alone || ac ? null : this.stampsFor(faults, t);
    const meter = stamps ? this.meterFor(t) : null;
    if (!stamps || !meter) {
      this.counts.full++;
      return model.predict(faults, [t])[0] as Prediction;
    }
    model.solves++;
    try {
      const r = meter.read(stamps);
      this.counts[r.method === 'full' ? 'fallback' : 'fast']++;
      return toPrediction(t.mode, r.measured);
    } catch (err) {
      if (isSolveFailure(err)) {
        this.counts.fallback++;
        return { value: 'unknown', reason: 'no-solve' };
      }
      if (err instanceof Error && err.name === 'HealthyUnsolved') {
        this.meters.set(testKey(t), null);
        return this.one(faults, t);
      }
      throw err;
    }
  }

  /** The faults as stamps against the test's state (shared by every test in that state), or null. */
  private stampsFor(faults: readonly SubFault[], t: ElectricalTest): RubberStamp[] | null {
    const fk = subFaultKey(faults);
    if (fk !== this.stampsOf) {
      this.stamps.clear();
      this.stampsOf = fk;
    }
    const k = stateKey(t);
    let s = this.stamps.get(k);
    if (s === undefined) {
      const state = this.model.stateCircuit(t);
      s = rubberStamps(state, applyFaults(state, faults, this.model.partsByName)) ?? null;
      this.stamps.set(k, s);
    }
    return s;
  }

  private meterFor(t: ElectricalTest): FaultMeter | null {
    const k = testKey(t);
    let m = this.meters.get(k);
    if (m === undefined) {
      m = new FaultMeter(this.model.stateCircuit(t), t, this.model.meter);
      this.meters.set(k, m);
    }
    return m;
  }
}
