/**
 * @splitscope/diagnosis — which part is bad, how sure we are, and what to measure next.
 * Generic core (model-agnostic) + the electrical adapter on @splitscope/circuit.
 */
export * from './core/index.js';
export { DEFAULT_MODES, TRANSFER_MODES, BULK_MODES, PART_KINDS, OPTO_LED_FACTOR, ELECTROLYTIC_THRESHOLD } from './electrical/kinds.js';
export type { PartKind, ModeTemplate, FaultAction } from './electrical/kinds.js';
export { buildParts, applyFaults, inferKind, toComponents } from './electrical/faults.js';
export type { ElectricalPart, ElectricalMode, PartOverride } from './electrical/faults.js';
export { ElectricalModel, testKey, stateKey } from './electrical/model.js';
export type { ElectricalTest, BoardModelInput } from './electrical/model.js';
export { logLikelihood as readingLogLikelihood, consistent as readingConsistent, bandOf, verdictOf, outcomeBins, isPredicted } from './electrical/noise.js';
export { groupLogLikelihood, broadLogLikelihood, isRepeated } from './electrical/repeats.js';
export type { RepeatedReading, ObservedValue } from './electrical/repeats.js';
export { isSolveFailure } from './electrical/meter.js';
export { partAloneCircuit, partAlonePrediction, partAloneRefusal, partAloneTable } from './electrical/part-alone.js';
export type { PartAloneRow } from './electrical/part-alone.js';
export { findHazards, HAZARD_VOLTS } from './electrical/hazard.js';
export type { Hazards } from './electrical/hazard.js';
export { KIND_WORDS, METER_FUNCTION, modeWords, defaultDesignator, probePoint } from './electrical/words.js';
export type { ProbePoint, ConnectorInput } from './electrical/words.js';
export { UNEXPLAINED_P } from './electrical/report.js';
export type { FaultWords, Unexplained } from './electrical/report.js';
export type { Prediction, ReadingValue, MeterMode, Verdict, Band } from './electrical/noise.js';
export { candidateTests, testCost, instruction, COST, HAZARD_CAUTION } from './electrical/nexttests.js';
export type { BenchState, Hazard } from './electrical/nexttests.js';
export { historyAdjustments, HISTORY_WEIGHT, KIND_WEIGHT } from './electrical/history.js';
export { referenceAdjustments, REFERENCE_OK_FACTOR, MIN_REFERENCE_BOARDS } from './electrical/references.js';
export type { ReferenceBand } from './electrical/references.js';
export type { FailureHistory, FailureCount } from './electrical/history.js';
export { CaseError, validateCaseShape } from './electrical/case.js';
export {
  DICTIONARY_FORMAT,
  buildDictionary,
  dictionaryTests,
  attachDictionary,
  takeWantedPairs,
  computePairs,
  addPairs,
  toBytes,
  fromBytes,
  encodePrediction,
  decodePrediction,
} from './electrical/dictionary.js';
export type { FaultDictionary, PairColumn, BuildOptions } from './electrical/dictionary.js';
export { Diagnoser, createDiagnoser } from './electrical/diagnoser.js';
export { diagnoseCase, validateCase } from './electrical/diagnose-case.js';
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
  PriorReport,
} from './electrical/case.js';
