/**
 * The expected-readings table of a board model: every test point against its reference, in each power state it
 * allows, in each meter mode it allows — powered dcv, unpowered ohm, diode and continuity — computed by the
 * circuit engine from the composed netlist, with a healthy band and, for ohm readings muddied by parallel
 * parts, a note that says so. A model is treated as immutable (stored versions never change), so the table is
 * cached per model object.
 */
import {
  DEFAULT_METER,
  flatten,
  measure,
  MeasurementError,
  normNode,
  parseNetlist,
  stateOf,
  type Circuit,
  type MeterMode,
  type MeterProfile,
} from '@splitscope/circuit';
import type { SourcedBand } from '../sections/bands';
import { parallelNote, resistorsByNets } from './parallel';

export interface ExpectedReadingsTestPoint {
  id: string;
  label?: string;
  net: string;
  /** Net of the black probe; default bus negative "0". */
  reference?: string;
  powerStates?: ('on' | 'off')[];
  modes?: MeterMode[];
  /** Healthy band of the powered reading from a standard or datasheet. */
  band?: SourcedBand;
}

/** What the table needs of a board model (a full board-model document fits, and so does a bare netlist with points). */
export interface ExpectedReadingsInput {
  netlist: string;
  params?: Record<string, number>;
  testPoints: ExpectedReadingsTestPoint[];
}

export interface ExpectedReading {
  id: string;
  testPoint: string;
  label: string;
  mode: MeterMode;
  /** The test point id the red probe goes on; `black` is the reference net. */
  red: string;
  black: string;
  redNet: string;
  power: 'on' | 'off';
  lifted: string[];
  expected: number | 'OL' | boolean;
  low: number | null;
  high: number | null;
  unit: 'V' | 'ohm';
  /** Where the band comes from, when a standard or datasheet fixes it. */
  source?: string;
  /** What the technician should know about this reading (parallel paths). */
  note?: string;
}

/** A healthy band around a computed reading. */
export type BandFn = (mode: MeterMode, expected: number) => { low: number; high: number };

/**
 * Default band: dcv ±(3 % + 30 mV) — a handheld meter's ±(0.5 % + a few counts) and the parts that set a rail
 * (1–5 %); ohm ±10 % — 5 % resistors, the meter's 1 % and junctions the test voltage starts to forward-bias;
 * diode ±0.1 V — junction spread with temperature and test current. All common practice / from memory.
 */
export const defaultBand: BandFn = (mode, v) => {
  if (mode === 'ohm') return { low: v * 0.9, high: v * 1.1 };
  if (mode === 'diode') return { low: v - 0.1, high: v + 0.1 };
  const d = Math.abs(v) * 0.03 + 0.03;
  return { low: v - d, high: v + d };
};

export interface ExpectedReadingsOptions {
  meter?: MeterProfile;
  band?: BandFn;
}

const ALL_MODES: MeterMode[] = ['dcv', 'ohm', 'diode', 'continuity'];
const round = (x: number) => (x === 0 || !Number.isFinite(x) ? x : Number(x.toPrecision(4)));

const cache = new WeakMap<object, { meter: MeterProfile; band: BandFn; rows: ExpectedReading[] }[]>();

/** The expected-readings table (cached per model object, meter and band). */
export function expectedReadings(model: ExpectedReadingsInput, options: ExpectedReadingsOptions = {}): ExpectedReading[] {
  const meter = options.meter ?? DEFAULT_METER;
  const band = options.band ?? defaultBand;
  const hits = cache.get(model) ?? [];
  const hit = hits.find((h) => h.meter === meter && h.band === band);
  if (hit) return hit.rows;
  const rows = compute(model, meter, band);
  cache.set(model, [...hits, { meter, band, rows }]);
  return rows;
}

function compute(model: ExpectedReadingsInput, meter: MeterProfile, band: BandFn): ExpectedReading[] {
  const full = flatten(parseNetlist(model.netlist), model.params);
  const states: Record<'on' | 'off', Circuit> = { on: stateOf(full, { power: 'on' }), off: stateOf(full, { power: 'off' }) };
  const byNets = resistorsByNets(full);
  const rows: ExpectedReading[] = [];
  for (const tp of model.testPoints) {
    const red = normNode(tp.net);
    const black = normNode(tp.reference ?? '0');
    if (red === black) continue;
    const modes = tp.modes ?? ALL_MODES;
    for (const power of tp.powerStates ?? ['on', 'off']) {
      for (const mode of modes) {
        if ((mode === 'dcv') !== (power === 'on')) continue;
        const row = reading(states[power], { tp, red, black, mode, power }, meter, band);
        if (!row) continue;
        if (mode === 'ohm') {
          const note = parallelNote(byNets, red, black, row.expected as number | 'OL');
          if (note) row.note = note;
        }
        rows.push(row);
      }
    }
  }
  return rows;
}

interface RowArgs {
  tp: ExpectedReadingsTestPoint;
  red: string;
  black: string;
  mode: MeterMode;
  power: 'on' | 'off';
}

function reading(circuit: Circuit, a: RowArgs, meter: MeterProfile, band: BandFn): ExpectedReading | undefined {
  let r;
  try {
    r = measure(circuit, { mode: a.mode, red: a.red, black: a.black }, meter);
  } catch (err) {
    // A test point on a net the netlist does not have: the board editor reports it; the table leaves it out.
    if (err instanceof MeasurementError) return undefined;
    throw err;
  }
  const base = {
    id: `${a.tp.id}:${a.mode}`,
    testPoint: a.tp.id,
    label: a.tp.label ?? a.tp.id,
    mode: a.mode,
    red: a.tp.id,
    black: a.black,
    redNet: a.red,
    power: a.power,
    lifted: [],
    unit: r.unit,
  };
  if (a.mode === 'continuity') return { ...base, expected: r.beep === true, low: null, high: null };
  if (r.value === 'OL') return { ...base, expected: 'OL', low: null, high: null };
  const v = r.value;
  const sourced = a.mode === 'dcv' ? a.tp.band : undefined;
  const b = sourced ?? band(a.mode, v);
  return { ...base, expected: round(v), low: round(b.low), high: round(b.high), ...(sourced ? { source: sourced.source } : {}) };
}
