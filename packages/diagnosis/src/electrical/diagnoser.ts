/**
 * A reusable diagnoser per board: readings in, candidates, words and next tests out. Predictions are cached per
 * meter profile across updates.
 *
 * Per update:
 * - readings of the same quantity (mode, nets, power, lifted parts) are one observation (repeats.ts);
 * - the core scores candidates (engine.ts), readings whose expected value cannot be computed are left out and
 *   said so per reading; "not explained" is decided by the rule in report.ts;
 * - next tests: the board's test points (or the nets around the likeliest parts) in every meter function, plus
 *   lifting one of the likeliest parts; never a test already taken (unless `confirm`), never one whose healthy
 *   value cannot be computed, and a powered probe on mains or the bus costs more and carries its caution.
 */
import { NetlistError, normNode, parseNetlist, type Element, type MeterProfile, type Netlist } from '@splitscope/circuit';
import { diagnose } from '../core/engine.js';
import { PredictionCache } from '../core/cache.js';
import { rankTests } from '../core/probe.js';
import { PriorAdjustmentError, type PriorAdjustment } from '../core/priors.js';
import { historyAdjustments } from './history.js';
import { referenceAdjustments } from './references.js';
import type { Observation } from '../core/types.js';
import { CaseError, checkReadingShape } from './case.js';
import type { BoardInput, CandidateReport, DiagnosisOutput, NextTestReport, ReadingReport, UpdateOptions } from './case.js';
import { checkingKeys } from './dictionary.js';
import { ElectricalModel, testKey, type ElectricalTest } from './model.js';
import { partAloneRefusal } from './part-alone.js';
import { priorNotes } from './prior-notes.js';
import { candidateTests, HAZARD_CAUTION, instruction, testCost, type BenchState, type Hazard, type TestPoint } from './nexttests.js';
import { bandOf, isPredicted, verdictOf, type Prediction, type ReadingValue } from './noise.js';
import type { ObservedValue } from './repeats.js';
import { candidateWords, faultWords, unexplainedOf, unpredictedNote, type Namer } from './report.js';
import { defaultDesignator, METER_FUNCTION, probePoint, type ConnectorInput, type PinPart, type ProbePoint } from './words.js';

interface MeterModel {
  model: ElectricalModel;
  cache: PredictionCache<ElectricalTest, Prediction>;
}

export class Diagnoser {
  readonly model: ElectricalModel;
  readonly cache: PredictionCache<ElectricalTest, Prediction>;
  readonly testPoints?: TestPoint[];
  private readonly partByLower: Map<string, string>;
  private readonly byMeter = new Map<MeterProfile, MeterModel>();
  private readonly names: Namer;

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
    const elementNames = new Set(netlist.elements.map((e) => e.name.toLowerCase()));
    for (const name of board.offBoard ?? [])
      if (!elementNames.has(name.toLowerCase())) throw new CaseError(`offBoard: no top-level element ${name} in the netlist`);
    try {
      this.model = new ElectricalModel({
        netlist,
        params: board.params,
        parts: board.parts,
        meter: board.meter,
        acMains: board.acMains?.map(normNode),
        offBoard: board.offBoard,
      });
    } catch (err) {
      const msg = (err as Error).message.split('\n')[0] ?? '';
      throw new CaseError(err instanceof NetlistError ? `netlist: ${msg}` : msg);
    }
    this.cache = new PredictionCache(this.model);
    this.byMeter.set(this.model.meter, { model: this.model, cache: this.cache });
    this.partByLower = new Map(this.model.parts.map((p) => [p.name.toLowerCase(), p.name]));
    if (board.testPoints) {
      board.testPoints.forEach((tp, i) => {
        for (const n of [tp.net, tp.ref ?? '0']) if (!this.model.nets.has(normNode(n))) throw new CaseError(`testPoints ${i}: unknown net ${n}`);
      });
      this.testPoints = board.testPoints.map((tp) => ({ ...tp, net: normNode(tp.net), ref: normNode(tp.ref ?? '0') }));
    }
    this.names = this.makeNamer(netlist, board);
  }

  private makeNamer(netlist: Netlist, board: BoardInput): Namer {
    const designators = new Map<string, string>();
    for (const p of this.model.parts) designators.set(p.name, defaultDesignator(p.name));
    for (const [k, v] of Object.entries(board.parts ?? {})) {
      const name = this.partByLower.get(k.toLowerCase());
      if (name && v.designator) designators.set(name, v.designator);
    }
    const designator = (part: string) => designators.get(part) ?? defaultDesignator(part);
    const valueOf = new Map<string, number>();
    for (const e of this.model.circuit.elements) if (e.kind === 'R' || e.kind === 'C') valueOf.set(e.part.toLowerCase(), e.value);
    const pins: PinPart[] = netlist.elements.flatMap((raw) => {
      const part = this.model.partsByName.get(raw.name);
      if (!part) return [];
      const sub = raw.letter === 'X' ? Object.values(netlist.subckts).find((x) => x.name.toLowerCase() === raw.model?.toLowerCase()) : undefined;
      return [
        {
          part,
          designator: designator(raw.name),
          letter: raw.letter,
          nodes: raw.nodes.map(normNode),
          ports: sub?.ports,
          value: valueOf.get(raw.name.toLowerCase()),
        },
      ];
    });
    const connectors: ConnectorInput[] = (board.connectors ?? []).map((c) => ({ ...c, pins: c.pins.map((p) => ({ ...p, net: normNode(p.net) })) }));
    const points = (this.testPoints ?? []).map((tp) => ({ ...tp }));
    const memo = new Map<string, ProbePoint>();
    const onBus = new Set(this.model.parts.filter((p) => p.nets.some((n) => this.model.hazards.bus.has(n))).map((p) => p.name));
    const kinds = new Map<string, Element['kind']>(this.model.circuit.elements.map((e) => [e.name.toLowerCase(), e.kind]));
    return {
      designator,
      point: (net) => {
        let p = memo.get(net);
        if (!p) memo.set(net, (p = probePoint(net, points, connectors, pins, onBus)));
        return p;
      },
      elementKind: (flat) => (flat ? kinds.get(flat) : undefined),
    };
  }

  /** The board's model read with a meter profile (the board's own by default): healthy predictions, bands. */
  modelFor(meter?: MeterProfile): ElectricalModel {
    return this.forMeter(meter).model;
  }

  /** The model and prediction cache for a meter profile (the board's own by default). */
  private forMeter(meter?: MeterProfile): MeterModel {
    if (!meter) return { model: this.model, cache: this.cache };
    let m = this.byMeter.get(meter);
    if (!m) {
      const model = this.model.withMeter(meter);
      m = { model, cache: new PredictionCache(model) };
      this.byMeter.set(meter, m);
    }
    return m;
  }

  /** Check readings against the board (nets, parts) and turn them into observations. Throws CaseError. */
  observations(readings: readonly unknown[]): Observation<ElectricalTest, ReadingValue>[] {
    return readings.map((r, i) => {
      checkReadingShape(r, i);
      const red = normNode(r.red);
      const black = normNode(r.black);
      if (!this.model.nets.has(red)) throw new CaseError(`reading ${i}: unknown net ${r.red}`);
      if (!this.model.nets.has(black)) throw new CaseError(`reading ${i}: unknown net ${r.black}`);
      const lifted = (r.lifted ?? []).map((p) => {
        const name = this.partByLower.get(p.trim().toLowerCase());
        if (!name) throw new CaseError(`reading ${i}: unknown part ${p} in lifted`);
        return name;
      });
      const test: ElectricalTest = { mode: r.mode, red, black, power: r.power, lifted: [...new Set(lifted)].sort() };
      if (r.alone !== undefined) {
        const part = this.model.partsByName.get(this.partByLower.get(r.alone.trim().toLowerCase()) ?? '');
        if (!part) throw new CaseError(`reading ${i}: unknown part ${r.alone} measured alone`);
        const refused = partAloneRefusal(test, part.name, part.nets);
        if (refused) throw new CaseError(`reading ${i}: ${refused}`);
        test.alone = part.name;
      }
      return { test, value: r.value };
    });
  }

  private hazardOf(model: ElectricalModel, t: Pick<ElectricalTest, 'red' | 'black' | 'power'>): Hazard | undefined {
    if (t.power !== 'on') return undefined;
    const nets = [t.red, t.black];
    if (nets.some((n) => model.hazards.ac.has(n))) return 'mains';
    if (nets.some((n) => model.hazards.bus.has(n))) return 'bus';
    return undefined;
  }

  update(readings: readonly unknown[], options: UpdateOptions = {}): DiagnosisOutput {
    const { model, cache } = this.forMeter(options.meter);
    const obs = this.observations(readings);
    const names = this.names;

    // Repeats: one observation per quantity (repeats.ts).
    const groupIdx = new Map<string, number>();
    const groups: { test: ElectricalTest; values: ReadingValue[]; first: number }[] = [];
    const groupOf = obs.map((o, i) => {
      const k = testKey(o.test);
      let g = groupIdx.get(k);
      if (g === undefined) {
        g = groups.length;
        groupIdx.set(k, g);
        groups.push({ test: o.test, values: [], first: i });
      }
      (groups[g] as (typeof groups)[number]).values.push(o.value);
      return g;
    });
    const gobs: Observation<ElectricalTest, ObservedValue>[] = groups.map((g) => ({
      test: g.test,
      value: g.values.length === 1 ? (g.values[0] as ReadingValue) : { repeats: g.values },
    }));
    let post: ReturnType<typeof diagnose>;
    try {
      post = diagnose(
        model,
        gobs,
        {
          pairTopK: options.pairTopK ?? 12,
          priors: [...this.historyPriors(model, options), ...this.resolvePriors(options.priors ?? []), ...this.referencePriors(model, obs, options)],
        },
        cache,
      );
    } catch (err) {
      if (err instanceof PriorAdjustmentError) throw new CaseError(err.message);
      throw err;
    }

    const readingReports: ReadingReport[] = obs.map((o, index) => {
      const healthy = model.healthyPrediction(o.test);
      const probes = { red: names.point(o.test.red), black: names.point(o.test.black) };
      const hazard = this.hazardOf(model, o.test);
      const base = { index, function: METER_FUNCTION[o.test.mode], probes, ...(hazard ? { hazard } : {}) };
      const first = (groups[groupOf[index] as number] as (typeof groups)[number]).first;
      const repeat =
        first !== index ? { repeatOf: first, note: `repeats reading ${first + 1}: the same quantity, counted once (the readings are averaged)` } : {};
      if (!isPredicted(healthy)) return { ...base, expected: null, verdict: 'ok' as const, ...repeat, note: unpredictedNote(healthy) };
      const band = bandOf(o.test.mode, healthy, model.meter);
      const rep: ReadingReport = {
        ...base,
        expected: typeof band.expected === 'number' ? sig(band.expected) : band.expected,
        verdict: verdictOf(o.test.mode, o.value, band),
        ...repeat,
      };
      if (band.low !== undefined) rep.low = sig(band.low);
      if (band.high !== undefined) rep.high = sig(band.high);
      return rep;
    });

    const top = options.top ?? 100;
    const listed = post.candidates.slice(0, top);
    const rest = post.candidates.slice(top).reduce((a, c) => a + c.probability, 0);
    const readingsOfGroup = (g: number) => groupOf.map((x, i) => (x === g ? i : -1)).filter((i) => i >= 0);

    // Predictions a board's dictionary does not hold yet are computed in the background (dictionary.ts).
    const checking = cache.defer ? checkingKeys(this) : undefined;
    const candidates: CandidateReport[] = listed.map((c) => {
      const isChecking = !!checking?.size && c.combos.some((k) => checking.has(k.key));
      const unpredicted = isChecking ? [] : c.unpredicted.flatMap(readingsOfGroup);
      return {
        ...(isChecking ? { checking: true as const } : {}),
        faults: c.faults.map((f) => ({ part: f.part, mode: f.mode })),
        probability: c.probability,
        evidence: obs.map((_, i) => {
          const e = c.evidence[groupOf[i] as number] as (typeof c.evidence)[number];
          return { reading: i, llr: Math.round(e.llr * 1000) / 1000, effect: e.sign };
        }),
        words: candidateWords(model, names, c),
        ...(unpredicted.length > 0 ? { unpredicted } : {}),
      };
    });

    const shown = (v: ReadingValue, mode: ElectricalTest['mode']) =>
      mode === 'continuity' ? (v ? 'beep' : 'no beep') : v === 'OL' ? 'OL' : `${sig(v as number)} ${mode === 'ohm' ? 'Ω' : 'V'}`;
    const unexplained = unexplainedOf(
      post,
      groupOf,
      obs.map((o) => o.test),
      names,
      obs.map((o) => shown(o.value, o.test.mode)),
    );

    const priors = (post.priorChanges ?? [])
      .filter((c) => c.steps.some((s) => s.note))
      .map((c) => ({ ...c, words: faultWords(model, names, c.part, c.mode) }))
      .sort((a, b) => Math.abs(Math.log(b.after / b.before)) - Math.abs(Math.log(a.after / a.before)) || a.part.localeCompare(b.part));
    return {
      readings: readingReports,
      candidates,
      parts: post.parts.map((p) => ({ part: p.part, mode: p.mode, probability: p.probability, words: faultWords(model, names, p.part, p.mode) })),
      restProbability: rest,
      minimalDiagnoses: post.minimalDiagnoses,
      nextTests: this.nextTests(model, cache, post, obs, options),
      entropy: post.entropy,
      unmodelledProbability: post.unmodelled?.probability ?? 0,
      ...(unexplained ? { unexplained } : {}),
      generated: post.generated,
      priors,
      priorNotes: priorNotes(priors),
      ...(checking?.size ? { checking: { candidates: post.candidates.filter((c) => c.combos.some((k) => checking.has(k.key))).length } } : {}),
    };
  }

  private historyPriors(model: ElectricalModel, options: UpdateOptions): PriorAdjustment[] {
    if (!options.history) return [];
    const names = this.names;
    const count = (n: number) => (Math.abs(n - Math.round(n)) < 0.05 ? String(Math.round(n)) : `about ${n.toFixed(1)}`);
    return historyAdjustments(model.parts, options.history, (key) => this.partNamed(key), {
      board: (part, mode, n, jobs) => `${faultWords(model, names, part, mode).text}: ${count(n)} of the last ${jobs} verified boards of this model`,
      kind: (part, mode, kind, n, jobs) =>
        `${faultWords(model, names, part, mode).words} on ${kind.replace(/-/g, ' ')}s of the shop's other models: ${count(n)} of ${jobs} verified boards`,
    });
  }

  private referencePriors(model: ElectricalModel, obs: Observation<ElectricalTest, ReadingValue>[], options: UpdateOptions): PriorAdjustment[] {
    if (!options.references?.length) return [];
    const bands = options.references.map((b) => ({ ...b, red: normNode(b.red), black: normNode(b.black) }));
    const fmt = (v: number, mode: ElectricalTest['mode']) => `${sig(v)} ${mode === 'ohm' ? 'Ω' : 'V'}`;
    return referenceAdjustments(model, obs, bands, (t, v, b) => {
      const p = this.names.point(t.red);
      return `${p.label} ${METER_FUNCTION[t.mode]} ${fmt(v, t.mode)} is within ${b.boards} known-good boards (${fmt(b.low, t.mode)} – ${fmt(b.high, t.mode)}) where the model gives no value: the parts on it are likelier sound`;
    });
  }

  private partNamed(key: string): string | undefined {
    const k = key.trim().toLowerCase();
    const direct = this.partByLower.get(k);
    if (direct) return direct;
    return this.model.parts.find((p) => this.names.designator(p.name).toLowerCase() === k)?.name;
  }

  /** Adjustments name parts by netlist name or printed designator; the core takes netlist names. */
  private resolvePriors(adjustments: readonly PriorAdjustment[]): PriorAdjustment[] {
    if (adjustments.length === 0) return [];
    return adjustments.map((a, i) => {
      const part = this.partNamed(a.part);
      if (!part) throw new CaseError(`priors ${i}: unknown part ${a.part}`);
      return { ...a, part };
    });
  }

  private nextTests(
    model: ElectricalModel,
    cache: PredictionCache<ElectricalTest, Prediction>,
    post: ReturnType<typeof diagnose>,
    obs: readonly Observation<ElectricalTest, ReadingValue>[],
    options: UpdateOptions,
  ): NextTestReport[] {
    // From the bench's current state (that of the last reading).
    const last = obs[obs.length - 1]?.test;
    const cur: BenchState = last ? { power: last.power, lifted: last.lifted } : { power: 'off', lifted: [] };
    const likelyParts: string[] = [];
    for (const pm of post.parts) {
      if (!likelyParts.includes(pm.part)) likelyParts.push(pm.part);
      if (likelyParts.length >= 8) break;
    }
    const partNets = (name: string) => ({ name, nets: model.partsByName.get(name)?.nets ?? [] });
    let points = this.testPoints;
    if (!points) {
      const nets = new Set<string>();
      for (const p of likelyParts) for (const n of partNets(p).nets) if (n !== '0') nets.add(n);
      for (const o of obs) for (const n of [o.test.red, o.test.black]) if (n !== '0') nets.add(n);
      points = [...nets].map((net) => ({ net, ref: '0' }));
    }
    const taken = new Set(obs.map((o) => testKey(o.test)));
    const tests = candidateTests({ points, cur, liftParts: likelyParts.slice(0, 3).map(partNets) }).filter(
      (t) => (options.confirm || !taken.has(testKey(t))) && isPredicted(model.healthyPrediction(t)),
    );
    const hazards = new Map(tests.map((t) => [t, this.hazardOf(model, t)]));
    const ranked = rankTests(
      model,
      post,
      tests,
      (t) => testCost(t, cur, hazards.get(t)),
      { maxCandidates: options.probeCandidates ?? 30, comboCutoff: 0.02, maxCombos: 3 },
      cache,
    );
    const names = this.names;
    return ranked.slice(0, options.nextTests ?? 10).map((r) => {
      const hazard = hazards.get(r.test);
      return {
        mode: r.test.mode,
        red: r.test.red,
        black: r.test.black,
        power: r.test.power,
        lifted: r.test.lifted,
        expectedEntropy: sig(r.expectedEntropy),
        cost: r.cost,
        instruction: instruction(
          { ...r.test, lifted: r.test.lifted.map(names.designator) },
          { ...cur, lifted: cur.lifted.map(names.designator) },
          names.point,
          hazard,
        ),
        function: METER_FUNCTION[r.test.mode],
        probes: { red: names.point(r.test.red), black: names.point(r.test.black) },
        liftedParts: r.test.lifted.map(names.designator),
        ...(hazard ? { hazard, caution: HAZARD_CAUTION[hazard] } : {}),
        ...(taken.has(testKey(r.test)) ? { confirmation: true } : {}),
      };
    });
  }
}

function sig(x: number): number {
  if (x === 0 || !Number.isFinite(x)) return x;
  return Number(x.toPrecision(4));
}

export function createDiagnoser(board: BoardInput): Diagnoser {
  return new Diagnoser(board);
}
