/**
 * Diagnosis cases: validation, a reusable diagnoser per board, and the `circuit diagnose` output shape.
 */
import { NetlistError, parseNetlist, type MeterProfile, type Netlist } from '@splitscope/circuit';
import { diagnose, PredictionCache } from '../core/engine.js';
import { rankTests } from '../core/probe.js';
import type { Observation } from '../core/types.js';
import { PART_KINDS, type PartKind } from './kinds.js';
import { ElectricalModel, type ElectricalTest } from './model.js';
import { candidateTests, instruction, testCost, type BenchState, type TestPoint } from './nexttests.js';
import { bandOf, verdictOf, type MeterMode, type Prediction, type ReadingValue, type Verdict } from './noise.js';

export type { TestPoint } from './nexttests.js';

export interface CaseReading {
  mode: MeterMode;
  red: string;
  black: string;
  power: 'on' | 'off';
  /** Parts lifted from the board for this reading (names as in the netlist). */
  lifted?: string[];
  /** dcv: volts; ohm: ohms or "OL"; diode: volts or "OL"; continuity: true (beep) / false. */
  value: number | 'OL' | boolean;
}

export interface CasePart {
  kind?: PartKind;
  priors?: Record<string, number>;
}

export interface DiagnosisCase {
  netlist: string;
  params?: Record<string, number>;
  parts?: Record<string, CasePart>;
  /** Test points offered for next tests; default: the nets of the likeliest parts and the nets probed. */
  testPoints?: TestPoint[];
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
  expected: number | 'OL' | boolean;
  low?: number;
  high?: number;
  verdict: Verdict;
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
}

export interface NextTestReport {
  mode: MeterMode;
  red: string;
  black: string;
  power: 'on' | 'off';
  lifted: string[];
  expectedEntropy: number;
  cost: number;
  instruction: string;
}

export interface DiagnosisOutput {
  readings: ReadingReport[];
  candidates: CandidateReport[];
  parts: { part: string; mode: string; probability: number }[];
  restProbability: number;
  minimalDiagnoses: string[][];
  nextTests: NextTestReport[];
  /** Entropy (bits) of the candidate posterior. */
  entropy: number;
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
}

export interface BoardInput {
  netlist: string | Netlist;
  params?: Record<string, number>;
  parts?: Record<string, CasePart>;
  testPoints?: TestPoint[];
  meter?: MeterProfile;
}

const MODES: readonly MeterMode[] = ['dcv', 'ohm', 'diode', 'continuity'];

function isRecord(x: unknown): x is Record<string, unknown> {
  return typeof x === 'object' && x !== null && !Array.isArray(x);
}

const show = (v: unknown) => (typeof v === 'string' ? `"${v}"` : JSON.stringify(v) ?? String(v));

/** Structural check of a case (no netlist knowledge). Throws CaseError. */
export function validateCaseShape(input: unknown): DiagnosisCase {
  if (!isRecord(input)) throw new CaseError('case: must be a JSON object');
  if (typeof input.netlist !== 'string' || input.netlist.trim() === '') throw new CaseError('netlist: must be the SPICE text');
  if (input.params !== undefined) {
    if (!isRecord(input.params)) throw new CaseError('params: must be an object of numbers');
    for (const [k, v] of Object.entries(input.params)) if (typeof v !== 'number' || !Number.isFinite(v)) throw new CaseError(`params.${k}: must be a number, got ${show(v)}`);
  }
  if (input.parts !== undefined) {
    if (!isRecord(input.parts)) throw new CaseError('parts: must be an object keyed by part name');
    for (const [k, v] of Object.entries(input.parts)) {
      if (!isRecord(v)) throw new CaseError(`parts.${k}: must be an object`);
      if (v.kind !== undefined && !PART_KINDS.includes(v.kind as PartKind)) throw new CaseError(`parts.${k}: unknown kind ${show(v.kind)} (${PART_KINDS.join(', ')})`);
      if (v.priors !== undefined) {
        if (!isRecord(v.priors)) throw new CaseError(`parts.${k}.priors: must be an object of numbers`);
        for (const [m, p] of Object.entries(v.priors)) if (typeof p !== 'number' || !(p >= 0 && p < 1)) throw new CaseError(`parts.${k}.priors.${m}: must be a number in [0, 1), got ${show(p)}`);
      }
    }
  }
  if (input.testPoints !== undefined) {
    if (!Array.isArray(input.testPoints)) throw new CaseError('testPoints: must be a list');
    input.testPoints.forEach((tp, i) => {
      if (!isRecord(tp) || typeof tp.net !== 'string') throw new CaseError(`testPoints ${i}: needs a net`);
    });
  }
  if (!Array.isArray(input.readings)) throw new CaseError('readings: must be a list');
  input.readings.forEach((r, i) => checkReadingShape(r, i));
  return input as unknown as DiagnosisCase;
}

function checkReadingShape(r: unknown, i: number): asserts r is CaseReading {
  const at = `reading ${i}`;
  if (!isRecord(r)) throw new CaseError(`${at}: must be an object`);
  if (!MODES.includes(r.mode as MeterMode)) throw new CaseError(`${at}: unknown mode ${show(r.mode)} (${MODES.join(', ')})`);
  const mode = r.mode as MeterMode;
  if (typeof r.red !== 'string' || r.red === '') throw new CaseError(`${at}: red must be a net name`);
  if (typeof r.black !== 'string' || r.black === '') throw new CaseError(`${at}: black must be a net name`);
  if (r.power !== 'on' && r.power !== 'off') throw new CaseError(`${at}: power must be "on" or "off", got ${show(r.power)}`);
  if (mode === 'dcv' && r.power !== 'on') throw new CaseError(`${at}: dcv is read with the board powered (power "on"), not "off"`);
  if (mode !== 'dcv' && r.power !== 'off') throw new CaseError(`${at}: ${mode} is read with the board unplugged and the bus discharged (power "off"), not "on"`);
  if (r.lifted !== undefined && (!Array.isArray(r.lifted) || r.lifted.some((p) => typeof p !== 'string'))) throw new CaseError(`${at}: lifted must be a list of part names`);
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

const normNet = (n: string) => {
  const l = n.trim().toLowerCase();
  return l === 'gnd' ? '0' : l;
};

/** A reusable diagnoser for one board (netlist, params, parts). Predictions are cached across updates. */
export class Diagnoser {
  readonly model: ElectricalModel;
  readonly cache: PredictionCache<ElectricalTest, Prediction>;
  private readonly testPoints?: TestPoint[];
  private readonly partByLower: Map<string, string>;

  constructor(board: BoardInput) {
    let netlist: Netlist;
    if (typeof board.netlist === 'string') {
      try {
        netlist = parseNetlist(board.netlist);
      } catch (err) {
        if (err instanceof NetlistError) throw new CaseError(`netlist: ${err.message}`);
        throw err;
      }
    } else netlist = board.netlist;
    try {
      this.model = new ElectricalModel({ netlist, params: board.params, parts: board.parts, meter: board.meter });
    } catch (err) {
      const msg = (err as Error).message.split('\n')[0] ?? '';
      throw new CaseError(err instanceof NetlistError ? `netlist: ${msg}` : msg);
    }
    this.cache = new PredictionCache(this.model);
    this.partByLower = new Map(this.model.parts.map((p) => [p.name.toLowerCase(), p.name]));
    if (board.testPoints) {
      board.testPoints.forEach((tp, i) => {
        for (const n of [tp.net, tp.ref ?? '0']) if (!this.model.nets.has(normNet(n))) throw new CaseError(`testPoints ${i}: unknown net ${n}`);
      });
      this.testPoints = board.testPoints.map((tp) => ({ ...tp, net: normNet(tp.net), ref: normNet(tp.ref ?? '0') }));
    }
  }

  /** Check readings against the board (nets, parts) and turn them into observations. Throws CaseError. */
  observations(readings: readonly unknown[]): Observation<ElectricalTest, ReadingValue>[] {
    return readings.map((r, i) => {
      checkReadingShape(r, i);
      const red = normNet(r.red);
      const black = normNet(r.black);
      if (!this.model.nets.has(red)) throw new CaseError(`reading ${i}: unknown net ${r.red}`);
      if (!this.model.nets.has(black)) throw new CaseError(`reading ${i}: unknown net ${r.black}`);
      const lifted = (r.lifted ?? []).map((p) => {
        const name = this.partByLower.get(p.trim().toLowerCase());
        if (!name) throw new CaseError(`reading ${i}: unknown part ${p} in lifted`);
        return name;
      });
      return { test: { mode: r.mode, red, black, power: r.power, lifted: [...new Set(lifted)].sort() }, value: r.value };
    });
  }

  update(readings: readonly unknown[], options: UpdateOptions = {}): DiagnosisOutput {
    const obs = this.observations(readings);
    const top = options.top ?? 100;
    const post = diagnose(this.model, obs, { pairTopK: options.pairTopK ?? 12 }, this.cache);

    const readingReports: ReadingReport[] = obs.map((o, index) => {
      const healthy = this.model.healthyPrediction(o.test);
      const band = bandOf(o.test.mode, healthy, this.model.meter);
      const rep: ReadingReport = { index, expected: typeof band.expected === 'number' ? sig(band.expected) : band.expected, verdict: verdictOf(o.test.mode, o.value, band) };
      if (band.low !== undefined) rep.low = sig(band.low);
      if (band.high !== undefined) rep.high = sig(band.high);
      return rep;
    });

    const listed = post.candidates.slice(0, top);
    const rest = post.candidates.slice(top).reduce((a, c) => a + c.probability, 0);

    // Next tests: from the bench's current state (that of the last reading).
    const last = obs[obs.length - 1]?.test;
    const cur: BenchState = last ? { power: last.power, lifted: last.lifted } : { power: 'off', lifted: [] };
    const likelyParts: string[] = [];
    for (const pm of post.parts) {
      if (!likelyParts.includes(pm.part)) likelyParts.push(pm.part);
      if (likelyParts.length >= 8) break;
    }
    const partNets = (name: string) => ({ name, nets: this.model.partsByName.get(name)?.nets ?? [] });
    let points = this.testPoints;
    if (!points) {
      const nets = new Set<string>();
      for (const p of likelyParts) for (const n of partNets(p).nets) if (n !== '0') nets.add(n);
      for (const o of obs) for (const n of [o.test.red, o.test.black]) if (n !== '0') nets.add(n);
      points = [...nets].map((net) => ({ net, ref: '0' }));
    }
    const tests = candidateTests({ points, cur, liftParts: likelyParts.slice(0, 3).map(partNets) });
    const ranked = rankTests(this.model, post, tests, (t) => testCost(t, cur), { maxCandidates: options.probeCandidates ?? 30, comboCutoff: 0.02, maxCombos: 3 }, this.cache);
    const labels = this.testPoints ?? [];
    const nextTests: NextTestReport[] = ranked.slice(0, options.nextTests ?? 10).map((r) => ({
      mode: r.test.mode,
      red: r.test.red,
      black: r.test.black,
      power: r.test.power,
      lifted: r.test.lifted,
      expectedEntropy: sig(r.expectedEntropy),
      cost: r.cost,
      instruction: instruction(r.test, cur, labels),
    }));

    return {
      readings: readingReports,
      candidates: listed.map((c) => ({
        faults: c.faults.map((f) => ({ part: f.part, mode: f.mode })),
        probability: c.probability,
        evidence: c.evidence.map((e) => ({ reading: e.index, llr: Math.round(e.llr * 1000) / 1000, effect: e.sign })),
      })),
      parts: post.parts.map((p) => ({ part: p.part, mode: p.mode, probability: p.probability })),
      restProbability: rest,
      minimalDiagnoses: post.minimalDiagnoses,
      nextTests,
      entropy: post.entropy,
    };
  }
}

function sig(x: number): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  return Number(x.toPrecision(4));
}

export function createDiagnoser(board: BoardInput): Diagnoser {
  return new Diagnoser(board);
}

/** Validate a case and diagnose it in one call. Throws CaseError on a bad case. */
export function diagnoseCase(caseInput: unknown, options: UpdateOptions & { meter?: MeterProfile } = {}): DiagnosisOutput {
  const c = validateCaseShape(caseInput);
  const d = new Diagnoser({ netlist: c.netlist, params: c.params, parts: c.parts, testPoints: c.testPoints, meter: options.meter });
  return d.update(c.readings, options);
}

/** Full validation of a case against its netlist (shape, nets, parts). Returns the typed case. */
export function validateCase(caseInput: unknown): DiagnosisCase {
  const c = validateCaseShape(caseInput);
  new Diagnoser({ netlist: c.netlist, params: c.params, parts: c.parts, testPoints: c.testPoints }).observations(c.readings);
  return c;
}
