/**
 * Diagnosis cases: their shape and validation, and the output shape of a diagnosis (`pnpm diagnose`, the
 * server's diagnosis). The diagnoser itself is in diagnoser.ts.
 */
import type { MeterProfile, Netlist } from '@splitscope/circuit';
import type { PriorAdjustment, PriorChange } from '../core/priors.js';
import type { PriorNote } from './prior-notes.js';
import type { FailureHistory } from './history.js';
import type { ReferenceBand } from './references.js';
import { PART_KINDS, type PartKind } from './kinds.js';
import type { Hazard, TestPoint } from './nexttests.js';
import type { MeterMode, Verdict } from './noise.js';
import type { FaultWords, Unexplained } from './report.js';
import type { ConnectorInput, ProbePoint } from './words.js';

export type { TestPoint } from './nexttests.js';

export interface CaseReading {
  mode: MeterMode;
  red: string;
  black: string;
  power: 'on' | 'off';
  /** Parts lifted from the board for this reading (names as in the netlist). */
  lifted?: string[];
  /** A lifted part measured out of circuit on its own pins (a name in `lifted`; red / black are its pin nets). */
  alone?: string;
  /** dcv: volts; ohm: ohms or "OL"; diode: volts or "OL"; continuity: true (beep) / false. */
  value: number | 'OL' | boolean;
}

export interface CasePart {
  kind?: PartKind;
  priors?: Record<string, number>;
  /** As printed on the board (U201 for the netlist's XU201); default: the name without a leading X. */
  designator?: string;
}

export interface DiagnosisCase {
  netlist: string;
  params?: Record<string, number>;
  parts?: Record<string, CasePart>;
  /** Test points offered for next tests; default: the nets of the likeliest parts and the nets probed. */
  testPoints?: TestPoint[];
  connectors?: ConnectorInput[];
  /** The meter the readings were taken with (default: the engine's default profile). */
  meter?: MeterProfile;
  readings: CaseReading[];
}

/** A bad case; `message` is one line naming the reading or field. */
export class CaseError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CaseError';
  }
}

export interface ReadingReport {
  index: number;
  /** What the healthy board reads; null when it could not be computed (see `note`), never a stand-in "OL". */
  expected: number | 'OL' | boolean | null;
  low?: number;
  high?: number;
  verdict: Verdict;
  /** Plain words when the reading is not scored or counts as a repeat. */
  note?: string;
  /** The first reading of the same quantity when this one repeats it (repeats refine, they do not add up). */
  repeatOf?: number;
  /** The meter function in the bench's words (DC V, Ω, diode, continuity). */
  function: string;
  /** The probe points as the bench names them. */
  probes: { red: ProbePoint; black: ProbePoint };
  /** Powered probe on a hazardous net. */
  hazard?: Hazard;
}

export interface EvidenceReport {
  reading: number;
  /** ln L(reading | candidate) - ln L(reading | no fault) */
  llr: number;
  effect: 'supports' | 'against' | 'neutral';
}

export interface CandidateReport {
  faults: { part: string; mode: string }[];
  probability: number;
  evidence: EvidenceReport[];
  /** The candidate in words: "U1 opto — LED open" (several faults joined by " + "). */
  words: { text: string; faults: FaultWords[] };
  /** Readings whose expected value could not be computed under this candidate (left out of its score). */
  unpredicted?: number[];
  /** Still being checked (dictionary.ts): scored as neutral on the readings it lacks a prediction for until then. */
  checking?: true;
}

export interface NextTestReport {
  mode: MeterMode;
  /** Nets (kept for compatibility; screens use `probes`). */
  red: string;
  black: string;
  power: 'on' | 'off';
  lifted: string[];
  expectedEntropy: number;
  cost: number;
  instruction: string;
  function: string;
  probes: { red: ProbePoint; black: ProbePoint };
  /** Lifted parts by designator. */
  liftedParts: string[];
  /** A powered probe on mains or the bus: show `caution`. */
  hazard?: Hazard;
  caution?: string;
  /** The test repeats one already taken (only when confirmations are asked for). */
  confirmation?: boolean;
}

export interface DiagnosisOutput {
  readings: ReadingReport[];
  candidates: CandidateReport[];
  parts: { part: string; mode: string; probability: number; words: FaultWords }[];
  restProbability: number;
  minimalDiagnoses: string[][];
  nextTests: NextTestReport[];
  /** Entropy (bits) of the candidate posterior. */
  entropy: number;
  /** Probability of a fault the model does not hold (counted in the normalisation of `candidates`). */
  unmodelledProbability: number;
  /** Present when the readings are not explained by any modelled fault (rule in report.ts). */
  unexplained?: Unexplained;
  /** How many multiple-fault candidates came from conflicts, and whether a bound cut the list. */
  generated: { pairs: number; triples: number; capped: boolean };
  /** Priors moved by `UpdateOptions.priors`, largest move first. */
  priors: PriorReport[];
  /** Why they moved, one line per reason in the bench's words (prior-notes.ts). */
  priorNotes: PriorNote[];
  /**
   * Candidates still being checked: predictions the board's dictionary lacks (fault pairs the readings call for,
   * a test outside it) are computed in the background (dictionary.ts); the ranking updates when they arrive.
   */
  checking?: { candidates: number };
}

export interface UpdateOptions {
  /** Candidates listed (default 100). */
  top?: number;
  /** Next tests listed (default 10). */
  nextTests?: number;
  /** Pairs among this many strongest singles (default 12). */
  pairTopK?: number;
  /** Probing considers at most this many candidates (default 30; each with its 3 heaviest sweep points). */
  probeCandidates?: number;
  /** The meter the readings were taken with (expected values and bands are computed with it). */
  meter?: MeterProfile;
  /** Offer tests already taken again, as confirmations (default false). */
  confirm?: boolean;
  /**
   * Per-job prior adjustments (core/priors.ts): `part` is the netlist name or the printed designator. Reported in
   * `priors` of the output with the words of each part and mode.
   */
  priors?: readonly PriorAdjustment[];
  /** The shop's verified failures (electrical/history.ts), applied before `priors`. */
  history?: FailureHistory;
  /** Bands measured on known-good boards: evidence for "ok" where the model is silent (electrical/references.ts). */
  references?: readonly ReferenceBand[];
}

/** A prior a per-job adjustment moved, with the steps (sources) that moved it. */
export interface PriorReport extends PriorChange {
  words: FaultWords;
}

export interface BoardInput {
  netlist: string | Netlist;
  params?: Record<string, number>;
  parts?: Record<string, CasePart>;
  testPoints?: TestPoint[];
  meter?: MeterProfile;
  /** Connectors: a net without a test point is named by a connector pin on it. */
  connectors?: ConnectorInput[];
  /** Nets the board names as AC mains (besides those found from its sources). */
  acMains?: string[];
  /**
   * Netlist elements that model what is not on the board (the load a connector sees): they shape every expected
   * value but are never candidates, lifted parts or names in the words. Unknown names are refused.
   */
  offBoard?: string[];
}

const MODES: readonly MeterMode[] = ['dcv', 'ohm', 'diode', 'continuity'];

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

const show = (v: unknown) => (typeof v === 'string' ? `"${v}"` : (JSON.stringify(v) ?? String(v)));

/** Structural check of a case (no netlist knowledge). Throws CaseError. */
export function validateCaseShape(input: unknown): DiagnosisCase {
  if (!isRecord(input)) throw new CaseError('case: must be a JSON object');
  if (typeof input.netlist !== 'string' || input.netlist.trim() === '') throw new CaseError('netlist: must be the SPICE text');
  if (input.params !== undefined) {
    if (!isRecord(input.params)) throw new CaseError('params: must be an object of numbers');
    for (const [k, v] of Object.entries(input.params))
      if (typeof v !== 'number' || !Number.isFinite(v)) throw new CaseError(`params.${k}: must be a number, got ${show(v)}`);
  }
  if (input.parts !== undefined) {
    if (!isRecord(input.parts)) throw new CaseError('parts: must be an object keyed by part name');
    for (const [k, v] of Object.entries(input.parts)) {
      if (!isRecord(v)) throw new CaseError(`parts.${k}: must be an object`);
      if (v.kind !== undefined && !PART_KINDS.includes(v.kind as PartKind))
        throw new CaseError(`parts.${k}: unknown kind ${show(v.kind)} (${PART_KINDS.join(', ')})`);
      if (v.priors !== undefined) {
        if (!isRecord(v.priors)) throw new CaseError(`parts.${k}.priors: must be an object of numbers`);
        for (const [m, p] of Object.entries(v.priors))
          if (typeof p !== 'number' || !(p >= 0 && p < 1)) throw new CaseError(`parts.${k}.priors.${m}: must be a number in [0, 1), got ${show(p)}`);
      }
    }
  }
  if (input.testPoints !== undefined) {
    if (!Array.isArray(input.testPoints)) throw new CaseError('testPoints: must be a list');
    input.testPoints.forEach((tp, i) => {
      if (!isRecord(tp) || typeof tp.net !== 'string') throw new CaseError(`testPoints ${i}: needs a net`);
    });
  }
  if (input.meter !== undefined) {
    const m = input.meter;
    if (!isRecord(m) || !MODES.every((k) => isRecord(m[k]))) throw new CaseError('meter: must be a meter profile (dcv, ohm, diode and continuity settings)');
  }
  if (!Array.isArray(input.readings)) throw new CaseError('readings: must be a list');
  input.readings.forEach((r, i) => checkReadingShape(r, i));
  return input as unknown as DiagnosisCase;
}

export function checkReadingShape(r: unknown, i: number): asserts r is CaseReading {
  const at = `reading ${i}`;
  if (!isRecord(r)) throw new CaseError(`${at}: must be an object`);
  if (!MODES.includes(r.mode as MeterMode)) throw new CaseError(`${at}: unknown mode ${show(r.mode)} (${MODES.join(', ')})`);
  const mode = r.mode as MeterMode;
  if (typeof r.red !== 'string' || r.red === '') throw new CaseError(`${at}: red must be a net name`);
  if (typeof r.black !== 'string' || r.black === '') throw new CaseError(`${at}: black must be a net name`);
  if (r.power !== 'on' && r.power !== 'off') throw new CaseError(`${at}: power must be "on" or "off", got ${show(r.power)}`);
  if (mode === 'dcv' && r.power !== 'on') throw new CaseError(`${at}: dcv is read with the board powered (power "on"), not "off"`);
  if (mode !== 'dcv' && r.power !== 'off')
    throw new CaseError(`${at}: ${mode} is read with the board unplugged and the bus discharged (power "off"), not "on"`);
  if (r.lifted !== undefined && (!Array.isArray(r.lifted) || r.lifted.some((p) => typeof p !== 'string')))
    throw new CaseError(`${at}: lifted must be a list of part names`);
  if (r.alone !== undefined && (typeof r.alone !== 'string' || r.alone === '')) throw new CaseError(`${at}: alone must be the name of a lifted part`);
  const v = r.value;
  if (mode === 'continuity') {
    if (typeof v !== 'boolean') throw new CaseError(`${at}: continuity value must be true (beep) or false, got ${show(v)}`);
  } else if (mode === 'dcv') {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new CaseError(`${at}: value must be a number, got ${show(v)}`);
  } else if (!(v === 'OL' || (typeof v === 'number' && Number.isFinite(v)))) {
    throw new CaseError(`${at}: value must be a number or "OL", got ${show(v)}`);
  } else if (mode === 'ohm' && typeof v === 'number' && v < 0) {
    throw new CaseError(`${at}: a resistance cannot be negative (${v})`);
  }
}
