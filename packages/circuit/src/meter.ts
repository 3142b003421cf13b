import type { Circuit, Element } from './circuit';
import { normNode, REFERENCE } from './circuit';
import { flatten } from './flatten';
import type { Netlist } from './netlist';
import { solveNodes, type NodeSolution, type SolveOptions } from './solver';

export type MeterMode = 'dcv' | 'ohm' | 'diode' | 'continuity';

export interface Probe {
  mode: MeterMode;
  red: string;
  black: string;
}

export interface BoardState {
  power: 'on' | 'off';
  /** Top-level part names removed from the board for this reading. */
  lifted?: string[];
  /** Parameter overrides, e.g. { FAN_ON: 0 }. */
  params?: Record<string, number>;
}

export interface Reading {
  value: number | 'OL';
  unit: 'V' | 'ohm';
  beep?: boolean;
}

/**
 * How the meter drives the circuit. All defaults are typical handheld-DMM values from memory (not from a
 * particular meter's manual); a profile can override any of them.
 */
export interface MeterProfile {
  dcv: {
    /** Input resistance between the probes, ohm (typical 10 MΩ; Infinity = ideal voltmeter). */
    inputResistance: number;
  };
  ohm: {
    /** Open-circuit test voltage, V (typical 0.5–1 V; low enough to leave most silicon junctions off). */
    openCircuitVoltage: number;
    /** Source resistance of the test source, ohm: short-circuit current = openCircuitVoltage / this. */
    sourceResistance: number;
    /** Largest value shown; above it the meter reads OL (typical 40–60 MΩ full scale). */
    overRange: number;
  };
  diode: {
    /** Open-circuit (compliance) voltage, V (typical 2.5–3.3 V). */
    openCircuitVoltage: number;
    /** Source resistance, ohm: chosen for ≈1 mA into a 0.6 V junction (typical test current 0.5–1.5 mA). */
    sourceResistance: number;
    /** Readings above this show OL, V (typical ≈2 V). */
    overRange: number;
  };
  continuity: {
    /** Beeps below this resistance, ohm (typical 10–100 Ω; 50 Ω chosen here). */
    threshold: number;
    /** Readings above this show OL, ohm (typical range full scale ≈ 600 Ω). */
    overRange: number;
    openCircuitVoltage: number;
    sourceResistance: number;
  };
}

/** Default meter: typical values from memory, see MeterProfile. */
export const DEFAULT_METER: MeterProfile = {
  dcv: { inputResistance: 10e6 },
  ohm: { openCircuitVoltage: 0.5, sourceResistance: 10e3, overRange: 40e6 },
  diode: { openCircuitVoltage: 3.0, sourceResistance: 2.4e3, overRange: 2.0 },
  continuity: { threshold: 50, overRange: 600, openCircuitVoltage: 0.5, sourceResistance: 1e3 },
};

/** A reading the meter must not take in the given context, or a probe on an unknown net. */
export class MeasurementError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'MeasurementError';
  }
}

/** Merges a partial profile over the defaults. */
export function meterProfile(overrides: { [K in keyof MeterProfile]?: Partial<MeterProfile[K]> } = {}): MeterProfile {
  return {
    dcv: { ...DEFAULT_METER.dcv, ...overrides.dcv },
    ohm: { ...DEFAULT_METER.ohm, ...overrides.ohm },
    diode: { ...DEFAULT_METER.diode, ...overrides.diode },
    continuity: { ...DEFAULT_METER.continuity, ...overrides.continuity },
  };
}

/**
 * The circuit of the board in a state. Power off: every independent V/I source with a non-zero value is removed
 * (open); zero-valued V sources (current senses) stay as shorts; capacitors are open at DC anyway.
 * Lifted parts (top-level names, case-insensitive) are removed. The netlist as written must have a DC path from
 * every node to the reference (NetlistError otherwise); islands created by the state solve with a tiny
 * conductance to the reference.
 */
export function applyState(netlist: Netlist, state: BoardState): Circuit {
  const full = flatten(netlist, state.params);
  return stateOf(full, state);
}

/** applyState on an already flattened circuit. */
export function stateOf(circuit: Circuit, state: Pick<BoardState, 'power' | 'lifted'>): Circuit {
  const lifted = new Set((state.lifted ?? []).map((p) => p.toLowerCase()));
  if (lifted.size > 0) {
    const parts = new Set(circuit.elements.map((e) => e.part.toLowerCase()));
    for (const p of state.lifted ?? []) {
      if (!parts.has(p.toLowerCase())) throw new MeasurementError(`cannot lift "${p}": no such part in the circuit`);
    }
  }
  const elements: Element[] = circuit.elements.filter((e) => {
    if (lifted.has(e.part.toLowerCase())) return false;
    if (state.power === 'off' && (e.kind === 'V' || e.kind === 'I') && e.value !== 0) return false;
    return true;
  });
  return { ...circuit, elements };
}

function checkNet(circuit: Circuit, net: string, which: string): string {
  const n = normNode(net);
  if (n === REFERENCE) return n;
  if (circuit.nets.includes(n)) return n;
  if (circuit.elements.some((e) => e.nodes.includes(n))) return n;
  throw new MeasurementError(`${which} probe: net "${net}" is not in the circuit`);
}

export interface MeasureOptions {
  /**
   * Passed to solveOp, e.g. `initialGuess` from an earlier reading of the same probe (`MeasuredReading.x`). A warm
   * start changes how many Newton iterations the solve takes, not the reading (within the solver's tolerance).
   * `extraNodes` is always the two probed nets.
   */
  solve?: Omit<SolveOptions, 'extraNodes'>;
}

/** A reading with the solved circuit behind it (undefined for a probe on one net, which needs no solve). */
export interface MeasuredReading {
  reading: Reading;
  /** Node voltages of the circuit with the meter attached (built when first read). */
  nodes?: Record<string, number>;
  /** Solution vector: `options.solve.initialGuess` for the next reading of the same probe on a variant. */
  x?: Float64Array;
}

const METER_NODE = 'meter#src';

/** A solved reading; the node record is built only when asked for (the diagnosis reads it once per probe). */
class Solved implements MeasuredReading {
  private record?: Record<string, number>;
  readonly x: Float64Array;
  constructor(
    readonly reading: Reading,
    private readonly solution: NodeSolution,
  ) {
    this.x = solution.x;
  }

  get nodes(): Record<string, number> {
    return (this.record ??= this.solution.nodes());
  }
}

const solved = (reading: Reading, s: NodeSolution): MeasuredReading => new Solved(reading, s);

/** Solves the circuit with the meter's elements attached; SolveError (never a reading) when it cannot be solved. */
function withMeter(circuit: Circuit, extra: Element[], red: string, black: string, solve: MeasureOptions['solve']): NodeSolution {
  return solveNodes({ ...circuit, elements: [...circuit.elements, ...extra] }, { ...solve, extraNodes: [red, black] });
}

function driven(circuit: Circuit, red: string, black: string, voc: number, rs: number, solve: MeasureOptions['solve']): { v: number; i: number; s: NodeSolution } {
  const extra: Element[] = [
    { kind: 'V', name: 'meter#v', part: 'meter#', nodes: [METER_NODE, black], value: voc },
    { kind: 'R', name: 'meter#r', part: 'meter#', nodes: [METER_NODE, red], value: rs },
  ];
  const s = withMeter(circuit, extra, red, black, solve);
  const vr = s.voltage(red);
  return { v: vr - s.voltage(black), i: (s.voltage(METER_NODE) - vr) / rs, s };
}

function resistanceReading(v: number, i: number, overRange: number): number | 'OL' {
  if (!(i > 0)) return 'OL';
  const r = v / i;
  if (!Number.isFinite(r) || r > overRange) return 'OL';
  return Math.max(0, r);
}

/**
 * Takes one reading on a circuit (already in the right state). The meter is modelled as it drives the circuit:
 * dcv loads it with its input resistance; ohm, continuity and diode connect a Thevenin test source between red (+)
 * and black and read V/I (ohm, continuity) or V (diode).
 */
export function measure(circuit: Circuit, probe: Probe, meter: MeterProfile = DEFAULT_METER, options: MeasureOptions = {}): Reading {
  return measureDetailed(circuit, probe, meter, options).reading;
}

/** measure, also returning the solution (a warm start for the same probe on a variant of the circuit). */
export function measureDetailed(circuit: Circuit, probe: Probe, meter: MeterProfile = DEFAULT_METER, options: MeasureOptions = {}): MeasuredReading {
  const red = checkNet(circuit, probe.red, 'red');
  const black = checkNet(circuit, probe.black, 'black');
  switch (probe.mode) {
    case 'dcv': {
      if (red === black) return { reading: { value: 0, unit: 'V' } };
      const rin = meter.dcv.inputResistance;
      const extra: Element[] = Number.isFinite(rin) && rin > 0 ? [{ kind: 'R', name: 'meter#rin', part: 'meter#', nodes: [red, black], value: rin }] : [];
      const s = withMeter(circuit, extra, red, black, options.solve);
      return solved({ value: s.voltage(red) - s.voltage(black), unit: 'V' }, s);
    }
    case 'ohm': {
      if (red === black) return { reading: { value: 0, unit: 'ohm' } };
      const { v, i, s } = driven(circuit, red, black, meter.ohm.openCircuitVoltage, meter.ohm.sourceResistance, options.solve);
      return solved({ value: resistanceReading(v, i, meter.ohm.overRange), unit: 'ohm' }, s);
    }
    case 'continuity': {
      const c = meter.continuity;
      if (red === black) return { reading: { value: 0, unit: 'ohm', beep: true } };
      const { v, i, s } = driven(circuit, red, black, c.openCircuitVoltage, c.sourceResistance, options.solve);
      const value = resistanceReading(v, i, c.overRange);
      return solved({ value, unit: 'ohm', beep: value !== 'OL' && value < c.threshold }, s);
    }
    case 'diode': {
      if (red === black) return { reading: { value: 0, unit: 'V' } };
      const { v, s } = driven(circuit, red, black, meter.diode.openCircuitVoltage, meter.diode.sourceResistance, options.solve);
      return solved({ value: v > meter.diode.overRange ? 'OL' : v, unit: 'V' }, s);
    }
    default:
      throw new MeasurementError(`unknown meter mode "${String((probe as Probe).mode)}" (dcv, ohm, diode, continuity)`);
  }
}

/** Why a reading is refused in a power state, or undefined when it may be taken. */
export function refusal(mode: MeterMode, power: 'on' | 'off'): string | undefined {
  if (mode === 'dcv' && power === 'off') {
    return (
      'refused: a dcv reading is taken with the board powered (power "on"). With the board unplugged and the bus ' +
      'discharged every node reads about 0 V, so the reading says nothing about the board. Safety: a 0 V reading ' +
      'taken "unpowered" must never stand in for the check that the bus capacitor is discharged. Meter damage: ' +
      'a technician expecting 0 V may leave the meter on a resistance or diode function and then meet live voltage.'
    );
  }
  if (mode !== 'dcv' && power === 'on') {
    return (
      `refused: a ${mode} reading is taken with the board unplugged and the bus discharged (power "off"). ` +
      'Safety: a powered inverter board carries rectified mains on its DC bus (hundreds of volts) at the probe ' +
      `points. Meter damage: the ${mode} function drives its own small test source and is not rated for an external ` +
      'voltage; a live circuit can blow the meter fuse or its protection, and the reading would be meaningless anyway.'
    );
  }
  return undefined;
}

/** Applies the board state and takes the reading; refuses readings the meter must not take in that state. */
export function read(netlist: Netlist, request: Probe & BoardState, meter: MeterProfile = DEFAULT_METER): Reading {
  const why = refusal(request.mode, request.power);
  if (why) throw new MeasurementError(why);
  const circuit = applyState(netlist, request);
  return measure(circuit, request, meter);
}
