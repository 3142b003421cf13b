/**
 * A lifted part measured out of circuit: with C10 off the board, the meter on C10's own pins reads C10 and
 * nothing else. The test is the part's elements alone, unpowered (its own non-zero sources removed, as a board
 * is unplugged), with the candidate's faults written in, read by the same meter model as every board reading
 * (`@splitscope/circuit` measureDetailed through meter.ts). So the reading is evidence about that part only: a
 * shorted C10 reads its short (a fraction of an ohm to a few tens, kinds.ts), a healthy one reads OL on Ω (a
 * capacitor is open at DC), and every other candidate predicts the healthy part.
 *
 * Sources: the meter model's ohm / diode / continuity sources (`MeterProfile`, typical handheld values from
 * memory); "lift one leg and measure the part on its own to take the board's parallel paths out" is common
 * practice at the bench.
 */
import type { Circuit, Element } from '@splitscope/circuit';
import type { SubFault } from '../core/types.js';
import { applyFaults } from './faults.js';
import { meterReading } from './meter.js';
import type { ElectricalModel, ElectricalTest } from './model.js';
import type { MeterMode, Prediction } from './noise.js';

/** Why a reading cannot be a part measured on its own pins, or null when it can (the diagnoser's case check). */
export function partAloneRefusal(
  test: Pick<ElectricalTest, 'mode' | 'red' | 'black' | 'power' | 'lifted'>,
  part: string,
  nets: readonly string[],
): string | null {
  if (test.power !== 'off' || test.mode === 'dcv') return `${part} is measured on its own pins unpowered (Ω, diode or continuity), not with DC V`;
  if (!test.lifted.some((p) => p.toLowerCase() === part.toLowerCase())) return `${part} is measured on its own pins only when it is lifted`;
  if (test.red === test.black) return `the probes are on the same pin of ${part}`;
  for (const n of [test.red, test.black]) if (!nets.includes(n)) return `${n} is not a pin of ${part}`;
  return null;
}

/**
 * The part's elements alone, as the meter sees them off the board: the flat circuit reduced to the part's own
 * elements (sub-circuit internals included), without its non-zero sources (a lifted part carries no supply);
 * a zero-volt sense source inside a model stays a short, as stateOf keeps it.
 */
export function partAloneCircuit(circuit: Circuit, part: string): Circuit {
  const name = part.toLowerCase();
  const elements: Element[] = circuit.elements.filter((e) => e.part.toLowerCase() === name && !((e.kind === 'V' || e.kind === 'I') && e.value !== 0));
  if (elements.length === 0) throw new Error(`no part ${part} in the circuit`);
  // The board's nets stay known (circuit.nets): a probe on them reads like an isolated pad, as after a lift.
  return { ...circuit, elements };
}

/** The reading of the part alone under some faults (only the part's own faults change it). */
export function partAlonePrediction(
  model: ElectricalModel,
  part: string,
  probe: { mode: MeterMode; red: string; black: string },
  faults: readonly SubFault[] = [],
): Prediction {
  const own = faults.filter((f) => f.component.toLowerCase() === part.toLowerCase());
  const c = applyFaults(partAloneCircuit(model.circuit, part), own, model.partsByName);
  try {
    return meterReading(c, probe, model.meter).prediction;
  } catch {
    return { value: 'unknown', reason: 'no-solve' };
  }
}

export interface PartAloneRow {
  /** The fault mode ("short", "dl:open"), or null for the healthy part. */
  mode: string | null;
  /** The mode's sweep point (ohms of a short, × of a drift); undefined for the healthy part and unswept modes. */
  point?: number;
  prediction: Prediction;
}

/**
 * What the part reads on its own pins, healthy and in each of its fault modes at each sweep point: the table a
 * screen shows beside "C10 lifted — measure C10 on its own pins", and what the scoring compares the reading to.
 */
export function partAloneTable(model: ElectricalModel, part: string, probe: { mode: MeterMode; red: string; black: string }): PartAloneRow[] {
  const p = model.parts.find((x) => x.name.toLowerCase() === part.toLowerCase());
  if (!p) throw new Error(`no part ${part} on the board`);
  const rows: PartAloneRow[] = [{ mode: null, prediction: partAlonePrediction(model, p.name, probe) }];
  for (const m of p.modes) {
    for (const [point, v] of m.sweep.entries()) {
      const fault = { component: p.name, mode: m.name, point, value: v };
      rows.push({ mode: m.name, ...(Number.isNaN(v) ? {} : { point: v }), prediction: partAlonePrediction(model, p.name, probe, [fault]) });
    }
  }
  return rows;
}
