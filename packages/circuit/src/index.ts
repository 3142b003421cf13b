/**
 * @splitscope/circuit — netlist parsing, flattening, DC operating point and meter models.
 * Public surface: docs/decisions/0001-engine-api.md (plus the helpers exported below).
 */
// registers the expression engine of {expressions} and .param values (expressions.ts)
import './mathjs-engine';
export { parseNetlist } from './netlist';
export type { ParseOptions } from './netlist';
export { NetlistError } from './netlist-types';
export type { Netlist, RawElement, RawValue, ModelDef, ParamDef, SubcktDef, ElementLetter } from './netlist-types';
export { flatten } from './flatten';
export type { FlattenOptions } from './flatten';
export { cloneCircuit, cloneElement, resistor, vsource, isource, diode, withoutParts, normNode, REFERENCE, DEFAULT_DIODE, DEFAULT_BJT } from './circuit';
export type {
  Circuit,
  Element,
  ResistorElement,
  CapacitorElement,
  InductorElement,
  VSourceElement,
  ISourceElement,
  DiodeElement,
  BjtElement,
  VcvsElement,
  VccsElement,
  CccsElement,
  CcvsElement,
  DiodeModel,
  BjtModel,
} from './circuit';
export { solveOp, solveNodes, NodeSolution, SolveError, VT, GMIN, GISLAND } from './solver';
export type { OpResult, SolveOptions, SolveMethod } from './solver';
export { measure, measureDetailed, read, applyState, stateOf, refusal } from './meter';
export { meterProfile, DEFAULT_METER, MeasurementError } from './meter-types';
export type { MeasureOptions, MeasuredReading } from './meter';
export type { Probe, BoardState, Reading, MeterProfile, MeterMode, TestSource, Accuracy, MeterRange } from './meter-types';
export { CC_AUTORANGE_6000, ANALOG_THEVENIN_20K, METER_PROFILES, meterProfileById, accuracyLimit } from './meter-profiles';
export { parseSpiceNumber } from './values';
export { nodesWithoutDcPath } from './topology';
export { HealthyFactor } from './fault-sim';
export { rubberStamps } from './rubber-stamps';
export type { RubberStamp } from './rubber-stamps';
export { FaultMeter } from './fault-meter';
