import type { Circuit, Element } from './circuit';
import { normNode, REFERENCE } from './circuit';
import { flatten } from './flatten';
import type { Netlist } from './netlist-types';
import { VT } from './devices';
import { solveNodes, type SolveOptions } from './solver';
import {
  DEFAULT_METER,
  MeasurementError,
  type MeterMode,
  type Probe,
  type BoardState,
  type Reading,
  type TestSource,
  type MeterRange,
  type MeterProfile,
} from './meter-types';

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
  /**
   * Solves the circuit with the meter's elements attached in place of solveNodes: the fault dictionary attaches
   * the meter to a faulted board through the healthy board's factors (fault-meter.ts). Called with the meter's
   * elements of one function / range; its solution is read exactly as a full solve's.
   */
  attach?: MeterAttach;
}

/** What the meter reads of a solved circuit: node voltages, and the vector a warm start of the next range takes. */
export interface MeterSolution {
  voltage(node: string): number;
  readonly x?: Float64Array;
  nodes(): Record<string, number>;
}

type MeterAttach = (extra: Element[], red: string, black: string) => MeterSolution;

/** The solve options threaded through a reading (one value, so that each range's solve passes the hook on). */
type SolveArgs = (MeasureOptions['solve'] & { attach?: MeterAttach }) | undefined;

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
  readonly x?: Float64Array;
  constructor(
    readonly reading: Reading,
    private readonly solution: MeterSolution,
  ) {
    this.x = solution.x;
  }

  get nodes(): Record<string, number> {
    return (this.record ??= this.solution.nodes());
  }
}

const solved = (reading: Reading, s: MeterSolution): MeasuredReading => new Solved(reading, s);

/** Solves the circuit with the meter's elements attached; SolveError (never a reading) when it cannot be solved. */
function withMeter(circuit: Circuit, extra: Element[], red: string, black: string, solve: SolveArgs): MeterSolution {
  if (solve?.attach) return solve.attach(extra, red, black);
  return solveNodes({ ...circuit, elements: [...circuit.elements, ...extra] }, { ...solve, extraNodes: [red, black] });
}

/** The Thevenin source a single-range function describes (DEFAULT_METER's style). */
const thevenin = (f: { openCircuitVoltage: number; sourceResistance: number }): TestSource => ({
  kind: 'thevenin',
  voc: f.openCircuitVoltage,
  rs: f.sourceResistance,
});

/**
 * The compliance clamp of a constant-current source: a diode across the probes whose knee sits at the compliance
 * voltage at the test current (Shockley: V = n·VT·ln(I/IS), IS fixed at 1e-30 A and n solved for), so an open
 * circuit reads `compliance` and anything well below it draws no measurable current from the source.
 */
const CLAMP_IS = 1e-30;
function clampModel(src: { current: number; compliance: number }) {
  return { is: CLAMP_IS, n: src.compliance / (VT * Math.log(src.current / CLAMP_IS)), rs: 0, bv: Infinity, ibv: 1e-3 };
}

/**
 * Drives the probes from a test source; v = V(red) − V(black), i = the current the meter takes as flowing (the
 * Thevenin source's actual current; a current source's nominal current, as its display is calibrated).
 */
function driven(circuit: Circuit, red: string, black: string, src: TestSource, solve: SolveArgs): { v: number; i: number; s: MeterSolution } {
  if (src.kind === 'current') {
    const extra: Element[] = [
      { kind: 'I', name: 'meter#i', part: 'meter#', nodes: [black, red], value: src.current },
      { kind: 'D', name: 'meter#clamp', part: 'meter#', nodes: [red, black], model: clampModel(src), area: 1 },
    ];
    const s = withMeter(circuit, extra, red, black, solve);
    return { v: s.voltage(red) - s.voltage(black), i: src.current, s };
  }
  const extra: Element[] = [
    { kind: 'V', name: 'meter#v', part: 'meter#', nodes: [METER_NODE, black], value: src.voc },
    { kind: 'R', name: 'meter#r', part: 'meter#', nodes: [METER_NODE, red], value: src.rs },
  ];
  const s = withMeter(circuit, extra, red, black, solve);
  const vr = s.voltage(red);
  return { v: vr - s.voltage(black), i: (s.voltage(METER_NODE) - vr) / src.rs, s };
}

function resistanceReading(v: number, i: number, overRange: number): number | 'OL' {
  if (!(i > 0)) return 'OL';
  const r = v / i;
  if (!Number.isFinite(r) || r > overRange) return 'OL';
  return Math.max(0, r);
}

/** The first range at or above `from` whose full scale holds `r`, or -1. */
const rangeFor = (ranges: readonly MeterRange[], r: number, from: number) => ranges.findIndex((g, k) => k >= from && r <= g.full);

/**
 * An autoranging ohmmeter: it shows the lowest range that is not overloaded. Each range is a solve; rather than
 * try every range from the bottom, the search jumps to the first range that can hold the value read so far. That
 * is exact when the reading V/I does not fall as the test current falls, which holds for the unpowered boards a
 * meter reads: networks of resistors and junctions have a concave V(I) through the origin (a series or parallel
 * combination of concave, resp. convex-in-V, branches stays so), so V/I is non-increasing in I and a lower range
 * (more current) can only read less. Two solves for a linear path, one when the lowest range holds it.
 */
function autorangeOhm(
  circuit: Circuit,
  red: string,
  black: string,
  ranges: readonly MeterRange[],
  solve: SolveArgs,
): { reading: number | 'OL'; s: MeterSolution; range: number } {
  let k = 0;
  let guess = solve?.initialGuess;
  for (;;) {
    const range = ranges[k] as MeterRange;
    const { v, i, s } = driven(circuit, red, black, range.source as TestSource, { ...solve, initialGuess: guess });
    const r = i > 0 ? v / i : Infinity;
    if (Number.isFinite(r) && r <= range.full) return { reading: Math.max(0, r), s, range: k };
    const next = Number.isFinite(r) ? rangeFor(ranges, r, k + 1) : -1;
    if (next < 0) return { reading: 'OL', s, range: ranges.length - 1 };
    k = next;
    guess = s.x;
  }
}

/**
 * Takes one reading on a circuit (already in the right state). The meter is modelled as it drives the circuit:
 * dcv loads it with its input resistance; ohm, continuity and diode connect the profile's test source (Thevenin or
 * constant current with its compliance clamp) between red (+) and black and read V/I (ohm, continuity) or V
 * (diode). A profile with Ω ranges autoranges (autorangeOhm); continuity uses the lowest Ω range's source.
 */
export function measure(circuit: Circuit, probe: Probe, meter: MeterProfile = DEFAULT_METER, options: MeasureOptions = {}): Reading {
  return measureDetailed(circuit, probe, meter, options).reading;
}

/** The test source continuity uses: its own, else the lowest Ω range's, else its Thevenin fields. */
const continuitySource = (m: MeterProfile): TestSource => m.continuity.source ?? m.ohm.ranges?.[0]?.source ?? thevenin(m.continuity);

/** measure, also returning the solution (a warm start for the same probe on a variant of the circuit). */
export function measureDetailed(circuit: Circuit, probe: Probe, meter: MeterProfile = DEFAULT_METER, options: MeasureOptions = {}): MeasuredReading {
  const red = checkNet(circuit, probe.red, 'red');
  const black = checkNet(circuit, probe.black, 'black');
  const solve: SolveArgs = options.attach ? { ...options.solve, attach: options.attach } : options.solve;
  switch (probe.mode) {
    case 'dcv': {
      if (red === black) return { reading: { value: 0, unit: 'V' } };
      return dcvReading(circuit, red, black, meter, solve);
    }
    case 'ohm': {
      if (red === black) return { reading: { value: 0, unit: 'ohm' } };
      const ranges = meter.ohm.ranges;
      if (ranges?.length) {
        const { reading, s } = autorangeOhm(circuit, red, black, ranges, solve);
        return solved({ value: reading, unit: 'ohm' }, s);
      }
      const { v, i, s } = driven(circuit, red, black, thevenin(meter.ohm), solve);
      return solved({ value: resistanceReading(v, i, meter.ohm.overRange), unit: 'ohm' }, s);
    }
    case 'continuity': {
      const c = meter.continuity;
      if (red === black) return { reading: { value: 0, unit: 'ohm', beep: true } };
      const { v, i, s } = driven(circuit, red, black, continuitySource(meter), solve);
      const value = resistanceReading(v, i, c.overRange);
      return solved({ value, unit: 'ohm', beep: value !== 'OL' && value < c.threshold }, s);
    }
    case 'diode': {
      if (red === black) return { reading: { value: 0, unit: 'V' } };
      const { v, s } = driven(circuit, red, black, meter.diode.source ?? thevenin(meter.diode), solve);
      return solved({ value: v > meter.diode.overRange ? 'OL' : v, unit: 'V' }, s);
    }
    default:
      throw new MeasurementError(`unknown meter mode "${String((probe as Probe).mode)}" (dcv, ohm, diode, continuity)`);
  }
}

/**
 * DC V. A meter with one input resistance loads the probes with it. An analog meter's input resistance is its
 * ohms-per-volt times the range's full scale: the reading is taken as a technician does, stepping down from a
 * range that holds the value to the lowest range that still holds it (each lower range loads the node more).
 */
function dcvReading(circuit: Circuit, red: string, black: string, meter: MeterProfile, solve: SolveArgs): MeasuredReading {
  const load = (rin: number): Element[] =>
    Number.isFinite(rin) && rin > 0 ? [{ kind: 'R', name: 'meter#rin', part: 'meter#', nodes: [red, black], value: rin }] : [];
  const ranges = meter.dcv.ranges;
  if (!ranges?.some((r) => r.inputResistance !== undefined)) {
    const s = withMeter(circuit, load(meter.dcv.inputResistance), red, black, solve);
    return solved({ value: s.voltage(red) - s.voltage(black), unit: 'V' }, s);
  }
  const rinOf = (k: number) => ranges[k]?.inputResistance ?? meter.dcv.inputResistance;
  const at = (k: number, guess: SolveOptions['initialGuess']) => {
    const s = withMeter(circuit, load(rinOf(k)), red, black, { ...solve, initialGuess: guess });
    return { s, v: s.voltage(red) - s.voltage(black) };
  };
  let k = ranges.length - 1;
  let cur = at(k, solve?.initialGuess);
  const start = rangeFor(ranges, Math.abs(cur.v), 0);
  if (start >= 0 && start < k) {
    k = start;
    cur = at(k, cur.s.x);
  }
  while (k > 0) {
    const lower = at(k - 1, cur.s.x);
    if (Math.abs(lower.v) > (ranges[k - 1] as MeterRange).full) break;
    k -= 1;
    cur = lower;
  }
  return solved({ value: cur.v, unit: 'V' }, cur.s);
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
