/**
 * @splitscope/diagnosis — which part is bad, how sure we are, and what to measure next.
 * Generic core (model-agnostic) + the electrical adapter on @splitscope/circuit.
 */
export * from './core/index.js';
export { DEFAULT_MODES, TRANSFER_MODES, PART_KINDS, OPTO_LED_FACTOR, ELECTROLYTIC_THRESHOLD } from './electrical/kinds.js';
export type { PartKind, ModeTemplate, FaultAction } from './electrical/kinds.js';
export { buildParts, applyFaults, inferKind, toComponents } from './electrical/faults.js';
export type { ElectricalPart, ElectricalMode, PartOverride } from './electrical/faults.js';
export { ElectricalModel, testKey, stateKey } from './electrical/model.js';
export type { ElectricalTest, BoardModelInput } from './electrical/model.js';
export { logLikelihood as readingLogLikelihood, consistent as readingConsistent, bandOf, verdictOf, outcomeBins } from './electrical/noise.js';
export type { Prediction, ReadingValue, MeterMode, Verdict, Band } from './electrical/noise.js';
export { candidateTests, testCost, instruction, COST } from './electrical/nexttests.js';
export type { BenchState } from './electrical/nexttests.js';
export { CaseError, Diagnoser, createDiagnoser, diagnoseCase, validateCase, validateCaseShape } from './electrical/case.js';
export type {
  DiagnosisCase,
  CaseReading,
  CasePart,
  TestPoint,
  DiagnosisOutput,
  ReadingReport,
  CandidateReport,
  EvidenceReport,
  NextTestReport,
  UpdateOptions,
  BoardInput,
} from './electrical/case.js';
