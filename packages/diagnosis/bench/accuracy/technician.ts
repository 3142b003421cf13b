// The scripted technician: takes the readings the symptom calls for, then each round the engine's first next test,
// measured on the faulted board through the bench meter (ngspice), until the engine's top candidate reaches 0.9,
// it offers no test, or the round limit. Everything the engine is given goes through its public API.
import { normNode } from '@splitscope/circuit';
import { createDiagnoser, type CaseReading, type DiagnosisOutput, type Diagnoser } from '../../src/index';
import { partKinds } from './board';
import type { BenchCase, TrueFault } from './cases';
import { engineMeter } from './engine-meter';
import { GroundTruthError } from './ngspice';
import { Noise, readMeter, type MeterStyle, type Probe } from './meter';

export const CONFIDENT = 0.9;
export const MAX_ROUNDS = 10;

export interface CaseResult {
  id: string;
  truth: string;
  top: string;
  topProbability: number;
  /** 1-based rank of the exact true fault set among the candidates; 0 = not listed. */
  rank: number;
  /** 1-based rank of the first candidate naming every true part (any mode). */
  partRank: number;
  rounds: number;
  repeats: number;
  engineErrors: string[];
  groundTruthError?: string;
  end: 'confident' | 'no test' | 'rounds' | 'error';
  readings: (CaseReading & { ideal: number | 'OL' })[];
  seconds: number;
  /** Time spent in the engine's updates (the rest is ngspice and the harness). */
  engineSeconds: number;
  /** Readings the engine itself calls low/high against its no-fault expectation at the end. */
  outOfBand: number;
  minimalDiagnoses: number;
  /** The engine's last verdict on each reading (expected value and band for a healthy board). */
  verdicts: DiagnosisOutput['readings'];
  /** The engine's five best candidates at the end, with their probabilities. */
  leaders: string[];
  /** The engine's own "not explained by any modelled fault" at the end, in its words. */
  unexplained?: string;
}

const key = (p: Probe) => [p.mode, p.red, p.black, p.power, [...(p.lifted ?? [])].sort().join('+')].join('|');

const matches = (faults: { part: string; mode: string }[], truth: readonly TrueFault[]) =>
  faults.length === truth.length && truth.every((t) => faults.some((f) => f.part === t.part && t.accept.test(f.mode)));

const names = (faults: { part: string; mode: string }[]) => (faults.length ? faults.map((f) => `${f.part} ${f.mode}`).join(' + ') : 'no fault');

/** One diagnoser per board variant, as the server keeps one engine per board. */
const diagnosers = new Map<string, Diagnoser>();

function diagnoserFor(c: BenchCase, params: Record<string, number>, meter: MeterStyle): Diagnoser {
  const id = `${c.board.id}:${meter}:${JSON.stringify(params)}`;
  let d = diagnosers.get(id);
  if (!d) {
    d = createDiagnoser({
      netlist: c.board.netlist(params),
      parts: partKinds(c.board, params),
      testPoints: c.board.testPoints,
      meter: engineMeter(meter),
      ...(c.board.acMains ? { acMains: c.board.acMains } : {}),
    });
    diagnosers.set(id, d);
  }
  return d;
}

export async function runCase(c: BenchCase, seed = 'bench-1', meter: MeterStyle = 'constant-current'): Promise<CaseResult> {
  const t0 = performance.now();
  const params = { ...c.board.defaults, ...c.params };
  const noise = new Noise(`${seed}/${c.id}`);
  const result: CaseResult = {
    id: c.id,
    truth: c.faults.length ? c.faults.map((f) => f.words).join(' + ') : 'no fault',
    top: '-',
    topProbability: 0,
    rank: 0,
    partRank: 0,
    rounds: 0,
    repeats: 0,
    engineErrors: [],
    end: 'error',
    readings: [],
    seconds: 0,
    engineSeconds: 0,
    outOfBand: 0,
    minimalDiagnoses: 0,
    verdicts: [],
    leaders: [],
  };
  const taken = new Set<string>();
  const take = async (p: Probe) => {
    const r = await readMeter(c.board, params, c.faults, p, noise, meter);
    result.readings.push({
      mode: p.mode,
      red: p.red,
      black: p.black,
      power: p.power,
      ...(p.lifted?.length ? { lifted: [...p.lifted] } : {}),
      value: r.value,
      ideal: r.ideal,
    });
    taken.add(key(p));
  };
  try {
    for (const p of c.start) await take(p);
    let diagnoser: Diagnoser;
    try {
      diagnoser = diagnoserFor(c, params, meter);
    } catch (e) {
      result.engineErrors.push(`board refused: ${(e as Error).message}`);
      return finish(result, t0);
    }
    for (;;) {
      let out: DiagnosisOutput;
      const t = performance.now();
      try {
        out = diagnoser.update(result.readings.map(({ ideal: _ideal, ...r }) => r));
      } catch (e) {
        result.engineErrors.push(`update: ${(e as Error).message.split('\n')[0]}`);
        break;
      } finally {
        result.engineSeconds += (performance.now() - t) / 1000;
      }
      score(result, out, c);
      if (result.topProbability >= CONFIDENT) {
        result.end = 'confident';
        break;
      }
      const next = out.nextTests[0];
      if (!next) {
        result.end = 'no test';
        break;
      }
      if (result.rounds >= MAX_ROUNDS) {
        result.end = 'rounds';
        break;
      }
      const probe = toProbe(c, next);
      const refusal = meterRefuses(probe);
      if (refusal) {
        result.engineErrors.push(`next test ${key(probe)}: ${refusal}`);
        break;
      }
      if (taken.has(key(probe))) result.repeats += 1;
      await take(probe);
      result.rounds += 1;
    }
  } catch (e) {
    // Counted in the table as a ground-truth failure, so one broken deck does not stop the bench.
    result.groundTruthError = e instanceof GroundTruthError ? e.message : `bench: ${(e as Error).message}`;
  }
  return finish(result, t0);
}

function finish(r: CaseResult, t0: number): CaseResult {
  r.seconds = (performance.now() - t0) / 1000;
  return r;
}

function score(r: CaseResult, out: DiagnosisOutput, c: BenchCase) {
  const truth = c.faults;
  const top = out.candidates[0];
  r.top = top ? (top.words?.text ?? names(top.faults)) : '-';
  r.topProbability = top?.probability ?? 0;
  const error = (m: string) => r.engineErrors.includes(m) || r.engineErrors.push(m);
  if (!out.candidates.every((x) => Number.isFinite(x.probability))) error('a candidate probability is not a number');
  // No board here carries more than ~330 V, well inside the meter's 1000 V range: a DC V expectation of OL is a
  // prediction the engine could not compute, shown as a value.
  for (const x of out.readings) {
    const reading = r.readings[x.index];
    if (reading?.mode === 'dcv' && x.expected === 'OL') error(`expects OL for DC V ${reading.red}–${reading.black}: an unsolved prediction shown as a value`);
    // ngspice solved every deck of this bench: a healthy reading the engine cannot compute is a solver failure
    // (DC V on the mains input excepted: the engine leaves it unscored on purpose).
    const mains = reading?.mode === 'dcv' && c.board.acMains?.some((n) => n === reading.red || n === reading.black);
    if (reading && x.expected === null && !mains)
      error(`could not compute the healthy ${reading.mode} ${reading.red}–${reading.black} (${reading.power}) that ngspice solves`);
  }
  r.unexplained = out.unexplained?.message;
  r.rank = out.candidates.findIndex((x) => matches(x.faults, truth)) + 1;
  r.partRank = out.candidates.findIndex((x) => truth.every((t) => x.faults.some((f) => f.part === t.part))) + 1;
  r.outOfBand = out.readings.filter((x) => x.verdict !== 'ok').length;
  r.minimalDiagnoses = out.minimalDiagnoses.length;
  r.verdicts = out.readings;
  r.leaders = out.candidates.slice(0, 5).map((x) => `${names(x.faults)} ${x.probability.toFixed(3)}`);
}

/** The engine names probe points by net; a test point label is accepted too. */
function toProbe(c: BenchCase, t: DiagnosisOutput['nextTests'][number]): Probe {
  const net = (n: string) => {
    const byLabel = c.board.testPoints.find((p) => p.label === n)?.net;
    return normNode(byLabel ?? n);
  };
  return { mode: t.mode, red: net(t.red), black: net(t.black), power: t.power, lifted: t.lifted ?? [] };
}

function meterRefuses(p: Probe): string | undefined {
  if (p.mode === 'dcv' && p.power === 'off') return 'DC volts asked on an unpowered board';
  if (p.mode !== 'dcv' && p.power === 'on') return `${p.mode} asked on a powered board (meter damage, wrong reading)`;
  return undefined;
}
