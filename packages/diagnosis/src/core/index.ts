export * from './types.js';
export {
  diagnose,
  PredictionCache,
  entropyBits,
  logSumExp,
  modeChoices,
  okPrior,
  partMarginals,
  minimalDiagnoses,
  subFaultKey,
  refsKey,
  type DiagnoseOptions,
} from './engine.js';
export { extendByConflicts, SUPPORT_LLR, type ConflictOptions } from './conflicts.js';
export { rankTests, testEntropy, activeSet, type ProbeOptions, type TestScore, type ActiveCandidate } from './probe.js';
export {
  adjustComponents,
  adjustedChoices,
  oddsUpdate,
  MAX_FAULT_SUM,
  PriorAdjustmentError,
  type PriorAdjustment,
  type PriorChange,
  type PriorStep,
} from './priors.js';
