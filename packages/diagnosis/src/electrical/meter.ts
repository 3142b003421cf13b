/**
 * The meter model of @splitscope/circuit (`measure`), taken with a warm start: the same attached elements
 * (10 MΩ input resistance for dcv; a Thevenin test source for ohm, continuity and diode) and the same
 * read-out rules, but solveOp starts from the healthy board's solution of the same probe and state, which
 * cuts Newton iterations several-fold when a fault is re-simulated. meter.test.ts checks it against `measure`.
 */
import { solveOp, type Circuit, type Element, type MeterProfile } from '@splitscope/circuit';
import type { Prediction } from './noise.js';
import type { MeterMode } from './noise.js';

const METER_NODE = 'meter#src';

export interface MeterResult {
  prediction: Prediction;
  /** Node voltages of the solved circuit (a warm start for the next solve of the same probe). */
  nodes?: Record<string, number>;
}

function resistanceReading(v: number, i: number, overRange: number): number | 'OL' {
  if (!(i > 0)) return 'OL';
  const r = v / i;
  if (!Number.isFinite(r) || r > overRange) return 'OL';
  return Math.max(0, r);
}

export function meterReading(
  circuit: Circuit,
  probe: { mode: MeterMode; red: string; black: string },
  meter: MeterProfile,
  guess?: Record<string, number>,
): MeterResult {
  const { red, black, mode } = probe;
  if (red === black) return { prediction: mode === 'continuity' ? { value: 0, beep: true } : { value: 0 } };
  const at = (nodes: Record<string, number>, n: string) => (n === '0' ? 0 : (nodes[n] ?? 0));
  if (mode === 'dcv') {
    const rin = meter.dcv.inputResistance;
    const elements: Element[] =
      Number.isFinite(rin) && rin > 0 ? [...circuit.elements, { kind: 'R', name: 'meter#rin', part: 'meter#', nodes: [red, black], value: rin }] : circuit.elements;
    const op = solveOp({ ...circuit, elements }, { extraNodes: [red, black], initialGuess: guess });
    if (!op.converged) return { prediction: { value: 'unknown' } };
    return { prediction: { value: at(op.nodes, red) - at(op.nodes, black) }, nodes: op.nodes };
  }
  const src = mode === 'ohm' ? meter.ohm : mode === 'continuity' ? meter.continuity : meter.diode;
  const elements: Element[] = [
    ...circuit.elements,
    { kind: 'V', name: 'meter#v', part: 'meter#', nodes: [METER_NODE, black], value: src.openCircuitVoltage },
    { kind: 'R', name: 'meter#r', part: 'meter#', nodes: [METER_NODE, red], value: src.sourceResistance },
  ];
  const op = solveOp({ ...circuit, elements }, { extraNodes: [red, black], initialGuess: guess });
  if (!op.converged) return { prediction: { value: 'unknown' } };
  const v = at(op.nodes, red) - at(op.nodes, black);
  const i = ((op.nodes[METER_NODE] ?? 0) - at(op.nodes, red)) / src.sourceResistance;
  if (mode === 'diode') return { prediction: { value: v > meter.diode.overRange ? 'OL' : v }, nodes: op.nodes };
  const value = resistanceReading(v, i, src.overRange);
  if (mode === 'continuity') return { prediction: { value, beep: value !== 'OL' && value < meter.continuity.threshold }, nodes: op.nodes };
  return { prediction: { value }, nodes: op.nodes };
}
