/**
 * The meter of @splitscope/circuit (`measureDetailed`) as a prediction: one meter model for the workbench and the
 * diagnosis. The warm start is the healthy board's solution of the same probe and state (node voltages by name,
 * since a fault changes the structure and so the solution vector's layout), which cuts Newton iterations
 * several-fold when a fault is re-simulated.
 */
import { measureDetailed, type Circuit, type MeasuredReading, type MeterProfile } from '@splitscope/circuit';
import type { MeterMode, Prediction } from './noise.js';

export interface MeterResult {
  prediction: Prediction;
  /** Node voltages of the solved circuit (a warm start for the next solve of the same probe); built when read. */
  nodes?: Record<string, number>;
}

/** The prediction with the solved circuit behind it (a class: it is made per solve, see MeterResult.nodes). */
class Read implements MeterResult {
  constructor(
    readonly prediction: Prediction,
    private readonly measured: MeasuredReading,
  ) {}

  get nodes(): Record<string, number> | undefined {
    return this.measured.nodes;
  }
}

/**
 * Whether an error from the circuit package means "this circuit could not be solved": a `SolveError` (thrown once
 * every continuation strategy has failed) or, from packages that predate it, a MeasurementError whose message
 * says "does not solve". Anything else (an unknown net, a bad netlist) is a real error.
 */
export function isSolveFailure(err: unknown): boolean {
  if (!(err instanceof Error)) return false;
  return err.name === 'SolveError' || (err.name === 'MeasurementError' && /does not solve/.test(err.message));
}

export function meterReading(
  circuit: Circuit,
  probe: { mode: MeterMode; red: string; black: string },
  meter: MeterProfile,
  guess?: Record<string, number>,
): MeterResult {
  let m: MeasuredReading;
  try {
    m = measureDetailed(circuit, probe, meter, { solve: { initialGuess: guess } });
  } catch (err) {
    // A circuit that does not solve with the meter attached predicts nothing (never a reading value).
    if (isSolveFailure(err)) return { prediction: { value: 'unknown', reason: 'no-solve' } };
    throw err;
  }
  return new Read(toPrediction(probe.mode, m), m);
}

/** A meter reading as a prediction (continuity keeps its beep). */
export function toPrediction(mode: MeterMode, m: MeasuredReading): Prediction {
  const { value, beep } = m.reading;
  return mode === 'continuity' ? { value, beep } : { value };
}
