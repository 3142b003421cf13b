/**
 * A meter reading on a faulted board through the healthy board's factors (fault-sim.ts).
 *
 * The meter is itself a stamp: DC V a resistance across the probes, Ω / continuity / diode a test source with its
 * resistance (or a current source with its compliance clamp). For one probe in one board state, the healthy board
 * with the meter of one function / range attached is solved and factored once; every fault given as rubber stamps
 * is then read from that factorisation, a rank-1/2 update per stamp (Woodbury), with the meter's own logic
 * (meter.ts: autoranging, the range steps of an analog DC V) unchanged: `measureDetailed` is called with a hook
 * that answers each of its solves from the factors. Where fault-sim falls back (docs/decisions/0006) the solve is
 * a full one, warm-started from the healthy point.
 */
import type { Circuit, Element } from './circuit';
import { HealthyFactor } from './fault-sim';
import type { FaultMethod, RubberStamp } from './rubber-stamps';
import { measureDetailed, type MeasuredReading, type MeterSolution } from './meter';
import type { MeterProfile, Probe } from './meter-types';

export interface FaultReading {
  measured: MeasuredReading;
  /** 'full' when any of the reading's solves fell back to a full solve. */
  method: FaultMethod;
}

/**
 * The meter's elements as a key (one factorisation per function / range): names, nodes and values; a current
 * source's clamp diode by its emission coefficient, the one parameter its compliance sets (meter.ts clampModel).
 */
const keyOf = (extra: readonly Element[]): string => {
  let k = '';
  for (const e of extra) k += `${e.name}:${e.nodes.join(',')}=${'value' in e ? e.value : e.kind === 'D' ? e.model.n : ''};`;
  return k;
};

/**
 * One probe on one board state (`circuit`, healthy), read under any number of faults given as rubber stamps
 * against that circuit. Holds one healthy factorisation per meter configuration the readings use.
 */
export class FaultMeter {
  private readonly factors = new Map<string, HealthyFactor | undefined>();

  constructor(
    private readonly circuit: Circuit,
    private readonly probe: Probe,
    private readonly meter: MeterProfile,
  ) {}

  /**
   * The reading with the stamps applied. Throws as `measureDetailed` does (SolveError when the faulted board with
   * the meter does not solve, MeasurementError for an unknown net).
   */
  read(stamps: readonly RubberStamp[]): FaultReading {
    let method: FaultMethod = 'woodbury';
    const attach = (extra: Element[], red: string, black: string): MeterSolution => {
      const k = keyOf(extra);
      if (!this.factors.has(k)) {
        this.factors.set(k, HealthyFactor.prepare({ ...this.circuit, elements: [...this.circuit.elements, ...extra] }, { extraNodes: [red, black] }));
      }
      const hf = this.factors.get(k);
      if (!hf) throw new HealthyUnsolved();
      const s = hf.solve(stamps);
      if (s.method === 'full') method = 'full';
      else if (method !== 'full') method = s.method;
      return s;
    };
    return { measured: measureDetailed(this.circuit, this.probe, this.meter, { attach }), method };
  }
}

/** The healthy board with this meter attached does not solve: the caller solves each fault in full. */
class HealthyUnsolved extends Error {
  constructor() {
    super('the healthy board with the meter attached does not solve');
    this.name = 'HealthyUnsolved';
  }
}
