/**
 * Generic, model-agnostic diagnosis core: types.
 *
 * A system has components; each component is `ok` or in one of its fault modes. A fault mode may be
 * parameterised (a resistor drifted to an unknown value, a capacitor shorted to an unknown low resistance);
 * the core handles the parameter by a finite sweep: every sweep point is a sub-mode that receives a share
 * (`weight`) of the mode's prior, and a candidate's likelihood is the sum over its sweep points.
 *
 * The core knows nothing about circuits: a `SystemModel` predicts an observable for a sub-mode assignment,
 * scores a reading against a prediction (its noise model), says whether a reading lies within its band
 * (consistency, for minimal diagnoses) and discretises the predicted outcome of a test (for probing).
 */
import type { PriorChange } from './priors.js';

export interface SweepPoint {
  /** Parameter value of this sub-mode (model-defined meaning: ohms, a multiplier, an output value ...). */
  value: number;
  /** Share of the mode's prior; the weights of one mode sum to 1. */
  weight: number;
  label?: string;
}

export interface FaultMode {
  name: string;
  /** Prior probability that the component is in this mode (all sweep points together). */
  prior: number;
  /** Finite sweep of the mode's parameter. Absent: a fixed mode (one implicit point, value NaN). */
  points?: readonly SweepPoint[];
}

export interface Component {
  name: string;
  /** Fault modes; `ok` is implicit with prior 1 - sum(fault priors). */
  modes: readonly FaultMode[];
}

/** One component in one fault mode at one sweep point. */
export interface SubFault {
  component: string;
  mode: string;
  /** Index into the mode's `points` (0 for a fixed mode). */
  point: number;
  /** The sweep point's parameter value (NaN for a fixed mode). */
  value: number;
}

/** A fault at mode level, as reported in candidates. */
export interface FaultRef {
  part: string;
  mode: string;
}

export interface Observation<T, V> {
  test: T;
  value: V;
}

/** An outcome bin of a test and its probability, e.g. ["low", 0.8]. */
export type OutcomeDistribution = ReadonlyArray<readonly [bin: string, probability: number]>;

export interface SystemModel<T, V, P> {
  readonly components: readonly Component[];
  /** Predict each test under the sub-fault assignment (empty = healthy system). One prediction per test. */
  predict(faults: readonly SubFault[], tests: readonly T[]): P[];
  /** Stable key of a test (for caching predictions and for de-duplicating tests). */
  testKey(test: T): string;
  /** Natural log of the likelihood of the reading given the prediction (the noise model). */
  logLikelihood(test: T, value: V, prediction: P): number;
  /** Whether the reading lies within the band the prediction allows (consistency-based diagnosis). */
  consistent(test: T, value: V, prediction: P): boolean;
  /** Discretised outcome distribution of the test if the system behaves as predicted. */
  outcomes(test: T, prediction: P): OutcomeDistribution;
  /**
   * Whether the prediction could be computed (default: always). A prediction that could not be computed (a
   * model that does not solve in that state) is left out: the reading counts for that candidate as it counts
   * for the healthy system (neutral), and in probing it tells nothing about that candidate.
   */
  predicted?(prediction: P): boolean;
  /**
   * ln density of the reading under a broad alternative ("something the model does not hold"), used for the
   * unmodelled-fault hypothesis. Absent: no such hypothesis is scored.
   */
  logLikelihoodBroad?(test: T, value: V): number;
  /**
   * Components a reading's prediction depends on most directly (its structural neighbourhood), used to build
   * the conflict of a reading a candidate leaves unexplained. Absent: conflicts come from the evidence alone.
   */
  suspects?(test: T): readonly string[];
}

export interface Combo {
  faults: SubFault[];
  /** Cache key of the sub-fault set. */
  key: string;
  /** Normalised posterior weight of this sweep combination within its candidate. */
  weight: number;
  /** Unnormalised log weight (log prior share + log likelihood) — used when re-weighting. */
  logWeight: number;
}

export interface CandidateEvidence {
  /** Index of the reading. */
  index: number;
  /** ln L(reading | candidate) - ln L(reading | no fault). Positive: the reading supports the candidate. */
  llr: number;
  sign: 'supports' | 'against' | 'neutral';
}

export interface ScoredCandidate {
  faults: FaultRef[];
  /** Posterior probability over the enumerated candidate set. */
  probability: number;
  /** ln prior (relative to the all-ok system) */
  logPrior: number;
  /** ln marginal likelihood of all readings (sum over sweep combinations, weighted by their prior share). */
  logLikelihood: number;
  /** Some sweep combination puts every reading within its band. */
  consistent: boolean;
  combos: Combo[];
  evidence: CandidateEvidence[];
  /** Readings (indices) outside their band under the candidate's heaviest sweep combination. */
  disagree: number[];
  /** Readings (indices) whose prediction could not be computed under some sweep combination of the candidate. */
  unpredicted: number[];
}

export interface PartMarginal {
  part: string;
  mode: string;
  probability: number;
}

export interface Posterior {
  candidates: ScoredCandidate[];
  parts: PartMarginal[];
  minimalDiagnoses: string[][];
  /** Shannon entropy (bits) of the candidate posterior. */
  entropy: number;
  /** How pairs were chosen: 'all' or 'top-k' (plus the conflict-driven extensions counted in `generated`). */
  pairRule: 'all' | 'top-k' | 'none';
  /** Multiple-fault candidates added from the conflicts of unexplained readings (see conflicts.ts). */
  generated: { pairs: number; triples: number; capped: boolean };
  /**
   * The unmodelled-fault hypothesis (a fault the model does not hold): its posterior probability, counted in the
   * normalisation of `candidates` (which then sum to 1 - probability). Absent when the model has no broad density.
   */
  unmodelled?: { probability: number; logLikelihood: number };
  /** Readings (indices) left out of scoring because the healthy system's prediction could not be computed. */
  excluded: number[];
  /** Priors the per-job adjustments moved (core/priors.ts), each with the steps that moved it. */
  priorChanges?: PriorChange[];
}
