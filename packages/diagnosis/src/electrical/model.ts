/**
 * Electrical system model: predictions from the circuit engine (@splitscope/circuit).
 *
 * A test is a meter reading in a board state (power on/off, parts lifted). A prediction for a sub-fault set is
 * the reading the meter model gives on the flat circuit in that state with the faults rewritten in
 * (faults.ts). Board states are built once per state key; predictions are cached by the core per
 * (sub-fault set, test), since they never depend on the readings.
 */
import { DEFAULT_METER, flatten, stateOf, type Circuit, type MeterProfile, type Netlist } from '@splitscope/circuit';
import type { Component, SubFault, SystemModel } from '../core/types.js';
import { applyFaults, buildParts, toComponents, type ElectricalPart, type PartOverride } from './faults.js';
import { findHazards, type Hazards } from './hazard.js';
import { meterReading } from './meter.js';
import { partAloneCircuit } from './part-alone.js';
import { isPredicted, outcomeBins, type MeterMode, type Prediction } from './noise.js';
import { broadLogLikelihood, groupConsistent, groupLogLikelihood, type ObservedValue } from './repeats.js';

export interface ElectricalTest {
  mode: MeterMode;
  /** Lower-case net names ("0" is the reference). */
  red: string;
  black: string;
  power: 'on' | 'off';
  /** Lifted parts as written in the netlist, sorted. */
  lifted: string[];
  /** A lifted part measured out of circuit on its own pins (red / black are its pin nets): part-alone.ts. */
  alone?: string;
}

export function stateKey(t: Pick<ElectricalTest, 'power' | 'lifted' | 'alone'>): string {
  return `${t.power}|${t.lifted.join(',')}${t.alone ? `|alone:${t.alone}` : ''}`;
}

export function testKey(t: ElectricalTest): string {
  return `${t.mode}|${t.red}|${t.black}|${stateKey(t)}`;
}

export interface BoardModelInput {
  netlist: Netlist;
  params?: Record<string, number>;
  parts?: Record<string, PartOverride>;
  meter?: MeterProfile;
  /** Nets the board names as AC mains (added to those found from the sources, hazard.ts). */
  acMains?: string[];
  /** Netlist elements that model something off the board (faults.ts `buildParts`). */
  offBoard?: string[];
}

export class ElectricalModel implements SystemModel<ElectricalTest, ObservedValue, Prediction> {
  readonly components: Component[];
  readonly parts: ElectricalPart[];
  readonly partsByName: Map<string, ElectricalPart>;
  readonly circuit: Circuit;
  readonly meter: MeterProfile;
  /** Every net of the board (lower-case). */
  readonly nets: Set<string>;
  /** Mains and bus nets of the powered board (hazard.ts). */
  readonly hazards: Hazards;
  /** Parts with a pin on each net. */
  private readonly partsOnNet = new Map<string, string[]>();
  private readonly states = new Map<string, Circuit>();
  private readonly healthy = new Map<string, Prediction>();
  private readonly guesses = new Map<string, Record<string, number>>();
  private readonly outcomeMemo = new WeakMap<Prediction, Array<[string, number]>>();
  /** Number of meter solves done (for the benchmark). */
  solves = 0;

  constructor(input: BoardModelInput, base?: ElectricalModel) {
    this.meter = input.meter ?? DEFAULT_METER;
    if (base) {
      // The same board under another meter profile: parts, circuit and hazards are shared; predictions are not.
      this.circuit = base.circuit;
      this.hazards = base.hazards;
      this.parts = base.parts;
      this.partsOnNet = base.partsOnNet;
    } else {
      this.circuit = flatten(input.netlist, input.params);
      this.hazards = findHazards(this.circuit, this.poweredVoltages(), input.acMains);
      this.parts = buildParts(input.netlist, this.circuit, input.parts, this.hazards, input.offBoard);
      for (const p of this.parts) {
        for (const n of p.nets) {
          const list = this.partsOnNet.get(n);
          if (list) list.push(p.name);
          else this.partsOnNet.set(n, [p.name]);
        }
      }
    }
    this.partsByName = new Map(this.parts.map((p) => [p.name, p]));
    this.components = toComponents(this.parts);
    this.nets = new Set(['0', ...this.circuit.nets]);
  }

  /** The same board read with another meter profile (shares everything but predictions). */
  withMeter(meter: MeterProfile): ElectricalModel {
    return new ElectricalModel({ netlist: undefined as unknown as Netlist, meter }, this);
  }

  /** Node voltages of the healthy powered board (an ideal voltmeter on the first net), for the hazard rules. */
  private poweredVoltages(): Record<string, number> | undefined {
    const net = this.circuit.nets.find((n) => n !== '0');
    if (!net) return undefined;
    try {
      const ideal = { ...DEFAULT_METER, dcv: { inputResistance: Infinity } };
      return meterReading(stateOf(this.circuit, { power: 'on', lifted: [] }), { mode: 'dcv', red: net, black: '0' }, ideal).nodes;
    } catch {
      return undefined;
    }
  }

  /** Parts with a pin on a probed net (the reference excluded): a reading's structural neighbourhood. */
  suspects(t: ElectricalTest): string[] {
    const out = new Set<string>();
    if (t.alone) return [t.alone]; // the part on its own pins: nothing else is in the measurement
    for (const n of [t.red, t.black]) if (n !== '0') for (const p of this.partsOnNet.get(n) ?? []) out.add(p);
    return [...out];
  }

  /** Names of parts with a pin on a net. */
  partsOn(net: string): readonly string[] {
    return this.partsOnNet.get(net) ?? [];
  }

  stateCircuit(t: Pick<ElectricalTest, 'power' | 'lifted' | 'alone'>): Circuit {
    const k = stateKey(t);
    let c = this.states.get(k);
    if (!c) {
      c = t.alone ? partAloneCircuit(this.circuit, t.alone) : this.unsmoothed(stateOf(this.circuit, { power: t.power, lifted: t.lifted }), t);
      this.states.set(k, c);
    }
    return c;
  }

  /**
   * Powered with every bulk capacitor of the bus lifted, the bus is the unsmoothed rectified sine: its source at
   * 2/π of the peak, as the bulk capacitor's open mode (kinds.ts BULK_MODES). The DC model alone would keep the
   * bus at its peak, since a capacitor is open at DC anyway.
   */
  private unsmoothed(c: Circuit, t: Pick<ElectricalTest, 'power' | 'lifted'>): Circuit {
    const src = this.hazards.busSource;
    if (t.power !== 'on' || !src || t.lifted.length === 0) return c;
    const bulk = this.parts.filter((p) => p.modes.some((m) => m.action === 'source-scale'));
    if (bulk.length === 0 || !bulk.every((p) => t.lifted.some((l) => l.toLowerCase() === p.name.toLowerCase()))) return c;
    return { ...c, elements: c.elements.map((e) => (e.kind === 'V' && e.name.toLowerCase() === src ? { ...e, value: (e.value * 2) / Math.PI } : e)) };
  }

  testKey(t: ElectricalTest): string {
    return testKey(t);
  }

  predict(faults: readonly SubFault[], tests: readonly ElectricalTest[]): Prediction[] {
    // the healthy board: its own cache, so that a test the next-test ranking already solved is not solved again
    if (faults.length === 0) return tests.map((t) => this.healthyPrediction(t));
    const byState = new Map<string, Circuit>();
    return tests.map((t) => {
      const k = stateKey(t);
      let c = byState.get(k);
      if (!c) {
        c = applyFaults(this.stateCircuit(t), faults, this.partsByName);
        byState.set(k, c);
      }
      return this.measureOn(c, t, this.guessFor(t));
    });
  }

  /** Warm start for a probe in a state: the healthy board's solution of the same measurement. */
  private guessFor(t: ElectricalTest): Record<string, number> | undefined {
    const k = testKey(t);
    if (!this.guesses.has(k)) this.healthyPrediction(t);
    return this.guesses.get(k);
  }

  private measureOn(c: Circuit, t: ElectricalTest, guess?: Record<string, number>): Prediction {
    // A DC voltmeter on an AC mains net reads nothing the DC model can predict (hazard.ts).
    if (t.mode === 'dcv' && (this.hazards.ac.has(t.red) || this.hazards.ac.has(t.black))) return AC_MAINS;
    this.solves++;
    try {
      const r = meterReading(c, t, this.meter, guess);
      if (!guess && r.nodes) this.guesses.set(testKey(t), r.nodes);
      return r.prediction;
    } catch {
      return { value: 'unknown', reason: 'no-solve' };
    }
  }

  /** The healthy board's prediction for a test (cached). */
  healthyPrediction(t: ElectricalTest): Prediction {
    const k = testKey(t);
    let p = this.healthy.get(k);
    if (!p) {
      p = this.measureOn(this.stateCircuit(t), t);
      this.healthy.set(k, p);
    }
    return p;
  }

  /** A healthy prediction computed elsewhere (the board's fault dictionary, dictionary.ts). */
  seedHealthy(t: ElectricalTest, p: Prediction): void {
    this.healthy.set(testKey(t), p);
  }

  logLikelihood(t: ElectricalTest, v: ObservedValue, p: Prediction): number {
    return groupLogLikelihood(t.mode, v, p, this.meter);
  }

  consistent(t: ElectricalTest, v: ObservedValue, p: Prediction): boolean {
    return groupConsistent(t.mode, v, p, this.meter);
  }

  predicted(p: Prediction): boolean {
    return isPredicted(p);
  }

  logLikelihoodBroad(t: ElectricalTest, v: ObservedValue): number {
    return broadLogLikelihood(t.mode, v, this.meter, this.hazards.maxVolts);
  }

  outcomes(t: ElectricalTest, p: Prediction): Array<[string, number]> {
    // Memoised per prediction object (each cached prediction belongs to one test).
    let o = this.outcomeMemo.get(p);
    if (!o) {
      o = outcomeBins(t.mode, p, this.healthyPrediction(t), this.meter);
      this.outcomeMemo.set(p, o);
    }
    return o;
  }
}

const AC_MAINS: Prediction = Object.freeze({ value: 'unknown', reason: 'ac-mains' }) as Prediction;
