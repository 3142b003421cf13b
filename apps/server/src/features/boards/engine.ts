// The engines' view of one stored board model version: its netlist, part priors and test points, a cached
// diagnoser, the expected-readings table (from the board library) and the verdict of a single reading against
// the healthy board. A version never changes, so everything here is cached per version id for the life of the
// process.
import { expectedReadings, type BandFn, type ExpectedReadingsInput, type ExpectedReadingsTestPoint } from '@splitscope/boards/readings';
import { meterProfileById, normNode, parseNetlist, refusal, type MeterProfile } from '@splitscope/circuit';
import {
  bandOf,
  CaseError,
  createDiagnoser,
  partAloneRefusal,
  verdictOf,
  type CasePart,
  type Diagnoser,
  type ReadingValue,
  type TestPoint,
} from '@splitscope/diagnosis';
import {
  boardModelSchema,
  boardTestPointSchema,
  unitOf,
  type BoardModel,
  type BoardPartKind,
  type ExpectedReadingRow,
  type MeterModeName,
  type MeterProfileId,
  type PowerState,
  type ReadingVerdict,
} from '@splitscope/contract';
import { AppError } from '../../http/errors';
import { isOlderDocument, photoOnlyForm, upgradeV1InMemory } from './document-form';
import { LRUCache } from 'lru-cache';

export interface BoardTestPoint extends TestPoint {
  id: string;
  /** What the expected table reads at this point (reference net, power states, modes, sourced band). */
  table: ExpectedReadingsTestPoint;
}

export interface BoardEngine {
  versionId: string;
  netlist: string;
  params?: Record<string, number>;
  parts: Record<string, CasePart>;
  testPoints: BoardTestPoint[];
  diagnoser: Diagnoser;
  /** The expected-readings table, computed on first use. */
  expected?: ExpectedReadingRow[];
  /** Set when the stored document cannot be read: the schema's complaint and the test points readings go on. */
  unreadable?: { problem: string; points: string[] };
}

/**
 * Board part kinds → the diagnosis engine's kinds, where the engine has the same kind. The others are left for the
 * engine to infer from the netlist element: a zener or thermistor is modelled by a diode or resistor element and
 * fails like one; a film capacitor, a connector, a fuse or an IC has no DC fault model of its own there.
 */
const ENGINE_KIND: Partial<Record<BoardPartKind, CasePart['kind']>> = {
  resistor: 'resistor',
  'ceramic-capacitor': 'ceramic-capacitor',
  'electrolytic-capacitor': 'electrolytic-capacitor',
  diode: 'diode',
  zener: 'diode',
  led: 'led',
  bjt: 'bjt',
  'opto-coupler': 'opto-coupler',
  regulator: 'regulator',
  thermistor: 'resistor',
};

/** The engine's part table: keyed by the netlist element that models each part, with its kind and priors. */
export function partsOf(model: BoardModel): Record<string, CasePart> {
  const out: Record<string, CasePart> = {};
  for (const p of model.parts) {
    if (!p.element) continue;
    const kind = ENGINE_KIND[p.kind];
    const part: CasePart = { ...(kind ? { kind } : {}), ...(p.priors ? { priors: p.priors } : {}) };
    if (part.kind || part.priors) out[p.element] = part;
  }
  return out;
}

/** Element letters that model a board part; sources (V, I) and controlled sources stand for no part of their own. */
const PART_LETTERS = new Set(['R', 'C', 'L', 'D', 'Q', 'X']);

/**
 * The netlist's top-level elements that are no part of the board's part list (the load a connector sees, the
 * motor): the engine keeps them in the circuit but never ranks, lifts or names them. A model that maps no part to
 * an element has no part list to go by, and every element stays a candidate.
 */
export function offBoardElements(model: BoardModel): string[] {
  const listed = new Set(model.parts.flatMap((p) => (p.element ? [p.element.toLowerCase()] : [])));
  if (listed.size === 0) return [];
  let elements: { name: string; letter: string }[];
  try {
    elements = parseNetlist(model.netlist).elements;
  } catch {
    return []; // the diagnoser refuses the netlist itself, naming the line
  }
  return elements.filter((e) => PART_LETTERS.has(e.letter) && !listed.has(e.name.toLowerCase())).map((e) => e.name);
}

function testPointsOf(model: BoardModel): BoardTestPoint[] {
  return model.testPoints.map((tp) => {
    const table: ExpectedReadingsTestPoint = {
      id: tp.id,
      label: tp.label,
      net: tp.net,
      reference: tp.reference,
      powerStates: tp.powerStates,
      modes: tp.modes,
      ...(tp.band ? { band: tp.band } : {}),
    };
    return { id: tp.id, net: tp.net, label: tp.label, ref: tp.reference, table };
  });
}

/**
 * A stored or sent document as the board model it must be: the one place a document is read. A document that does
 * not match the schema is a 422 naming the first field at fault.
 */
export function readBoardModel(doc: unknown): BoardModel {
  // A stored document in an older form (written before this server's start-up upgrade ran, or by an older server
  // beside it) is read through the same upgrade in memory: stored data never makes a job unreadable.
  const parsed = boardModelSchema.safeParse(isOlderDocument(doc) ? upgradeV1InMemory(doc as Record<string, unknown>).document : doc);
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0]!;
  const path = ['document', ...issue.path.map(String)].join('.');
  throw new AppError('invalid', `The board model does not match the board-model schema: ${path}: ${issue.message}`, {
    errors: [{ path, message: issue.message }],
  });
}

/**
 * A stored version's document for showing and recording: the model, or, when the schema rejects it even after the
 * in-memory upgrade, the board as a photo with the test points that still read (no sections, no parts: readings
 * are recorded, not judged) and the schema's complaint, so a job on it still opens and a lead can correct it.
 */
export function readStoredBoardModel(doc: unknown, board: { key: string; name: string }): { model: BoardModel; problem: string | null } {
  try {
    return { model: readBoardModel(doc), problem: null };
  } catch (err) {
    if (!(err instanceof AppError)) throw err;
    const form = photoOnlyForm(doc, board, (tp) => boardTestPointSchema.safeParse(tp).success);
    return { model: boardModelSchema.parse(form), problem: err.message };
  }
}

/**
 * Schematics print values in the IEC 60062 letter code (2K2 = 2.2 kΩ, 4R7 = 4.7 Ω), which SPICE does not read:
 * the solver refuses such a value rather than guess, and the refusal says what to type instead.
 */
function rkmHint(message: string): string {
  const m = /"(\d+)([RKM])(\d+)"/i.exec(message);
  if (!m) return '';
  const scale = { r: '', k: 'k', m: 'meg' }[m[2]!.toLowerCase() as 'r' | 'k' | 'm'];
  return ` (the letter in ${m[0]} stands for the decimal point, as printed on schematics; in a netlist write ${m[1]}.${m[3]}${scale})`;
}

/** Builds the engine view of a board model; a model the engines cannot use is a 422 naming why. */
export function buildBoardEngine(versionId: string, model: BoardModel): BoardEngine {
  const { netlist, params } = model;
  const parts = partsOf(model);
  const testPoints = testPointsOf(model);
  try {
    const diagnoser = createDiagnoser({
      netlist,
      params,
      parts,
      offBoard: offBoardElements(model),
      testPoints: testPoints.map(({ id, net, label, ref }) => ({ id, net, label, ref })),
      // A net with no test point is named by its connector pin ("CN3 pin 3") before a part's pin.
      connectors: model.connectors.map((c) => ({
        name: c.name,
        pins: c.pins.map((p) => ({ pin: p.pin, net: p.net, ...(p.function ? { function: p.function } : {}) })),
      })),
    });
    return { versionId, netlist, params, parts, testPoints, diagnoser };
  } catch (err) {
    if (err instanceof CaseError) {
      const message = err.message + rkmHint(err.message);
      throw new AppError('invalid', `The board model cannot be used: ${message}`, { errors: [{ path: 'document', message }] });
    }
    throw err;
  }
}

// Versions whose engine was dropped for room since the last look, so a diagnosis thread can tell the server which
// documents it no longer holds (the server's pool asks this instead of keeping a copy of the limit).
let dropped: string[] = [];
const cache = new LRUCache<string, BoardEngine>({ max: 50, dispose: (_engine, versionId, reason) => void (reason === 'evict' && dropped.push(versionId)) });

/** The versions whose engine this thread dropped since the last call. */
export function takeDroppedEngines(): string[] {
  const out = dropped;
  dropped = [];
  return out;
}

/**
 * The engine for a stored version, built once per process (the diagnoser's prediction cache survives). The
 * expected table stored with the version, when given, is the one its verdicts read: it is what the screens show
 * for that version, and computing it again takes seconds of the server's time.
 */
export function boardEngine(versionId: string, doc: unknown, storedTable?: unknown): BoardEngine {
  const hit = cachedBoardEngine(versionId);
  if (hit) return hit;
  const stored = readStoredBoardModel(doc, { key: versionId, name: 'board' });
  if (stored.problem) {
    // No sections or parts: nothing is judged. Its points are the test points that still read. Not cached, so
    // the corrected form a lead stores for this version is what the next call builds.
    const { testPoints, ...rest } = stored.model;
    return { ...buildBoardEngine(versionId, { ...rest, testPoints: [] }), unreadable: { problem: stored.problem, points: testPoints.map((t) => t.id) } };
  }
  const built = buildBoardEngine(versionId, stored.model);
  if (Array.isArray(storedTable) && storedTable.length > 0) built.expected = storedTable as ExpectedReadingRow[];
  cache.set(versionId, built);
  return built;
}

/** The engine for a version already built in this process, so a caller can skip loading its document. */
export function cachedBoardEngine(versionId: string): BoardEngine | undefined {
  return cache.get(versionId);
}

/** A probe name as typed (a test point id or a net name) → the net, or undefined when the board has neither. */
const pointIds = new WeakMap<BoardEngine, Map<string, BoardTestPoint>>();
export function resolveNet(engine: BoardEngine, name: string): string | undefined {
  let byId = pointIds.get(engine);
  if (!byId) {
    byId = new Map();
    // The first point of an id wins, as a search in order would find it.
    for (const t of engine.testPoints) if (!byId.has(t.id.toLowerCase())) byId.set(t.id.toLowerCase(), t);
    pointIds.set(engine, byId);
  }
  const tp = byId.get(name.trim().toLowerCase());
  const net = normNode(tp ? tp.net : name);
  return engine.diagnoser.model.nets.has(net) ? net : undefined;
}

/** Lifted part names as typed → the netlist's names, or the first unknown one. */
const partNames = new WeakMap<BoardEngine, Map<string, string>>();
export function resolveParts(engine: BoardEngine, names: readonly string[]): { parts: string[] } | { unknown: string } {
  if (names.length === 0) return { parts: [] };
  let byLower = partNames.get(engine);
  if (!byLower) partNames.set(engine, (byLower = new Map(engine.diagnoser.model.parts.map((p) => [p.name.toLowerCase(), p.name]))));
  const parts: string[] = [];
  for (const n of names) {
    const name = byLower.get(n.trim().toLowerCase());
    if (!name) return { unknown: n };
    if (!parts.includes(name)) parts.push(name);
  }
  return { parts: parts.sort() };
}

/**
 * The part a reading measures on its own pins, as the netlist names it, or why it cannot be: the engine's check
 * (lifted, unpowered, the probes on two of its pins).
 */
export function resolveAlone(engine: BoardEngine, name: string, probe: ProbeState): { part: string } | { refused: string } {
  const found = resolveParts(engine, [name]);
  if ('unknown' in found) return { refused: `Unknown part "${name}" on this board model` };
  const part = engine.diagnoser.model.partsByName.get(found.parts[0]!)!;
  const why = partAloneRefusal(probe, part.name, part.nets);
  return why ? { refused: why } : { part: part.name };
}

/** Why a reading cannot be taken in that power state (the circuit engine's own wording), if it cannot. */
export const powerRefusal = (mode: MeterModeName, power: PowerState) => refusal(mode, power);

export interface ProbeState {
  mode: MeterModeName;
  red: string;
  black: string;
  power: PowerState;
  lifted: string[];
  /** A lifted part measured on its own pins (its netlist name): the engine's part-alone prediction, no table row. */
  alone?: string;
}

const round = (x: number) => (x === 0 || !Number.isFinite(x) ? x : Number(x.toPrecision(4)));

/** The shipped meter profile of an id; undefined (the board's generic meter) for none. */
export const meterOf = (id: MeterProfileId | null | undefined): MeterProfile | undefined => (id ? meterProfileById(id) : undefined);

/** The diagnoser's update options for a job's meter profile. */
export const meterOptions = (id: MeterProfileId | null | undefined): { meter?: MeterProfile } => {
  const meter = meterOf(id);
  return meter ? { meter } : {};
};

/**
 * The healthy board's band for a probe and how a value compares, from the diagnosis engine's noise model, with
 * the meter the reading was taken with (a sourced band of the table stands whatever the meter). Null when the
 * engine cannot predict this probe.
 */
export function verdictFor(engine: BoardEngine, probe: ProbeState, value: ReadingValue | null, meter?: MeterProfile): ReadingVerdict | null {
  const row = probe.alone ? undefined : tableRow(engine, probe);
  if (row?.source && row.low !== null && row.high !== null) {
    // A sourced band (a datasheet's output tolerance, the mains range) is the healthy range the table shows.
    const band = { expected: row.expected, low: row.low, high: row.high };
    return { expected: row.expected, low: row.low, high: row.high, unit: row.unit, verdict: value === null ? 'ok' : verdictOf(probe.mode, value, band) };
  }
  const model = engine.diagnoser.modelFor(meter);
  const test = {
    mode: probe.mode,
    red: probe.red,
    black: probe.black,
    power: probe.power,
    lifted: probe.lifted,
    ...(probe.alone ? { alone: probe.alone } : {}),
  };
  const healthy = model.healthyPrediction(test);
  if (healthy.value === 'unknown') return null;
  const band = bandOf(probe.mode, healthy, model.meter);
  const expected = typeof band.expected === 'number' ? round(band.expected) : band.expected;
  return {
    expected,
    low: band.low === undefined ? null : round(band.low),
    high: band.high === undefined ? null : round(band.high),
    unit: unitOf(probe.mode),
    verdict: value === null ? 'ok' : verdictOf(probe.mode, value, band),
  };
}

/** The diagnoser's noise band, so an unsourced row of the table and the verdict of a reading agree. */
function diagnoserBand(engine: BoardEngine, meter: MeterProfile = engine.diagnoser.model.meter): BandFn {
  return (mode, value) => {
    const b = bandOf(mode, { value }, meter);
    return { low: b.low ?? value, high: b.high ?? value };
  };
}

/**
 * The expected-readings table: every test point against its reference in each power state and meter mode it
 * allows, computed by the board library from the netlist. Bands come from the point's sourced band (powered
 * readings of the main rails) or the diagnoser's noise model; ohm rows carry the parallel-path note.
 */
export function expectedTable(engine: BoardEngine): ExpectedReadingRow[] {
  engine.expected ??= computeTable(engine, engine.diagnoser.model.meter);
  return engine.expected;
}

function computeTable(engine: BoardEngine, meter: MeterProfile): ExpectedReadingRow[] {
  const input: ExpectedReadingsInput = {
    netlist: engine.netlist,
    testPoints: engine.testPoints.map((t) => t.table),
    ...(engine.params ? { params: engine.params } : {}),
  };
  let rows: ReturnType<typeof expectedReadings>;
  try {
    rows = expectedReadings(input, { meter, band: diagnoserBand(engine, meter) });
  } catch (err) {
    // A netlist that reads but does not solve in one of the states the table reads (a deck written elsewhere can
    // do that) is the author's to fix: said in words, not a server error.
    if (!(err instanceof Error) || err.name !== 'SolveError') throw err;
    const message = `the netlist does not solve in every state the expected readings need (${err.message}); check the deck's models and values`;
    throw new AppError('invalid', `The board model cannot be used: ${message}`, { errors: [{ path: 'document.netlist', message }] });
  }
  return rows.map((r) => ({
    id: r.id,
    label: r.label,
    mode: r.mode,
    red: r.red,
    black: r.black,
    power: r.power,
    lifted: r.lifted,
    expected: r.expected,
    low: r.low,
    high: r.high,
    unit: r.unit,
    ...(r.source ? { source: r.source } : {}),
    ...(r.note ? { note: r.note } : {}),
  }));
}

// Tables for a meter profile other than the board's generic meter, per engine (so per version) and profile.
const tablesByMeter = new WeakMap<BoardEngine, Map<MeterProfileId, ExpectedReadingRow[]>>();

/**
 * The expected-readings table read with a job's meter profile: a reading through a junction (Ω, diode) depends on
 * the meter's test current, so the stored table (the board's generic meter) is not the job's. Computed on first
 * use per version and profile (about a second on a demo board) and kept with the engine; null profile = the
 * stored table.
 */
export function expectedTableFor(engine: BoardEngine, profile: MeterProfileId | null): ExpectedReadingRow[] {
  const meter = meterOf(profile);
  if (!profile || !meter) return expectedTable(engine);
  let byMeter = tablesByMeter.get(engine);
  if (!byMeter) tablesByMeter.set(engine, (byMeter = new Map()));
  let rows = byMeter.get(profile);
  if (!rows) byMeter.set(profile, (rows = computeTable(engine, meter)));
  return rows;
}

const probeKey = (mode: string, power: string, red: string, black: string) => `${mode} ${power} ${red} ${black}`;
// Every reading write looks its probe up in the table, so the table is indexed by probe once per engine.
const tableIndex = new WeakMap<BoardEngine, Map<string, ExpectedReadingRow>>();

/** The table row a probe reads, when it is one (no parts lifted). */
function tableRow(engine: BoardEngine, probe: ProbeState): ExpectedReadingRow | undefined {
  if (probe.lifted.length > 0) return undefined;
  let index = tableIndex.get(engine);
  if (!index) {
    index = new Map();
    for (const r of expectedTable(engine)) {
      const red = resolveNet(engine, r.red);
      const black = resolveNet(engine, r.black);
      const key = red && black ? probeKey(r.mode, r.power, red, black) : undefined;
      if (key && !index.has(key)) index.set(key, r);
    }
    tableIndex.set(engine, index);
  }
  return index.get(probeKey(probe.mode, probe.power, probe.red, probe.black));
}
