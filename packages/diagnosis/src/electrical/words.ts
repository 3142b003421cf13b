/**
 * The bench's words for what the engine computes: part designators as printed, a kind word per part, fault
 * modes in words ("LED open", "base–emitter open", "shorted"), meter functions (DC V, Ω, diode, continuity) and
 * probe points named as a technician finds them on the board: the test point's label (with its connector pin
 * when it has one), else a connector pin on the net, else the nearest part pin ("C10 +", "Q1 collector").
 * Simulator internals (subcircuit element names such as XU1.DL, bare net names) never leave the engine through
 * these fields.
 */
import type { Element } from '@splitscope/circuit';
import type { ElectricalMode, ElectricalPart } from './faults.js';
import type { PartKind } from './kinds.js';
import type { MeterMode } from './noise.js';

export const KIND_WORDS: Readonly<Record<PartKind, string>> = {
  resistor: 'resistor',
  'ceramic-capacitor': 'capacitor',
  'electrolytic-capacitor': 'capacitor',
  inductor: 'inductor',
  diode: 'diode',
  led: 'LED',
  bjt: 'transistor',
  'opto-coupler': 'opto',
  regulator: 'regulator',
  subcircuit: 'part',
  source: 'source',
};

const MODE_WORDS: Readonly<Record<string, string>> = {
  short: 'shorted',
  open: 'open',
  leaky: 'leaky',
  'ce-short': 'collector–emitter short',
  'be-open': 'base–emitter open',
  'bc-open': 'base–collector open',
  'be-short': 'base–emitter short',
  dead: 'dead (no output)',
  'out-short': 'output shorted to ground',
  'in-out-short': 'input–output short',
  'current-limit': 'in current limit (output sags under load)',
  'dried-out': 'dried out (lost capacitance, bus ripple)',
};

const ELEMENT_WORDS: Partial<Record<Element['kind'], string>> = { R: 'resistor', C: 'capacitor', L: 'inductor', D: 'diode', Q: 'transistor' };

/** The designator as printed: the board's, else the netlist name without a subcircuit instance's leading X. */
export function defaultDesignator(name: string): string {
  return /^X[A-Z0-9]/i.test(name) && name.length > 1 ? name.slice(1).toUpperCase() : name.toUpperCase();
}

/**
 * A mode in words. `value`: the sweep point the readings favour (a drift direction), `targetKind`: the kind of
 * the internal element a subcircuit mode rewrites.
 */
export function modeWords(part: ElectricalPart, mode: ElectricalMode, targetKind?: Element['kind'], value?: number): string {
  const colon = mode.name.indexOf(':');
  const base = colon >= 0 ? mode.name.slice(colon + 1) : mode.name;
  const plain = (b: string, v?: number): string => {
    if (b === 'drift') return v === undefined || Number.isNaN(v) ? 'value drifted' : v < 1 ? 'value low' : 'value high';
    return MODE_WORDS[b] ?? b.replace(/-/g, ' ');
  };
  if (mode.action === 'source-scale') return base === 'open' ? 'open (bus unsmoothed)' : plain(base);
  if (colon < 0) return plain(base, value);
  // A mode of an element inside a subcircuit: name the element by its role, never by its netlist name.
  const transfer = targetKind === 'F' || targetKind === 'G' || targetKind === 'E' || targetKind === 'H';
  if (part.kind === 'opto-coupler') {
    if (targetKind === 'D') return `LED ${plain(base)}`;
    if (transfer) return base === 'open' ? 'no output (transfer lost)' : base === 'drift' ? 'CTR degraded' : `transfer ${plain(base, value)}`;
    if (targetKind === 'Q') return `output transistor ${plain(base)}`;
  }
  if (transfer) return base === 'drift' ? 'gain degraded' : `internal transfer ${plain(base, value)}`;
  return `internal ${ELEMENT_WORDS[targetKind as Element['kind']] ?? 'element'} ${plain(base, value)}`;
}

export const METER_FUNCTION: Readonly<Record<MeterMode, string>> = { dcv: 'DC V', ohm: 'Ω', diode: 'diode', continuity: 'continuity' };

/** A probe point as the bench names it. */
export interface ProbePoint {
  /** "TP5", "TP5 (CN3 pin 1)", "CN3 pin 3", "C10 +", "Q1 collector". */
  label: string;
  /** What it is ("Fan control supply (VFAN)", "Speed pulses", "no test point on this net"). */
  description?: string;
  /**
   * The point as a next test's sentence names it: a test point as printed, then what it is ("TP5 Fan control
   * supply (VFAN)", as the readings list reads); a connector pin or a part pin by itself ("CN3 pin 3", "C10 +").
   */
  said: string;
}

export interface NamedTestPoint {
  net: string;
  /** The test point's name as printed (TP5). */
  id?: string;
  /** Its label; read as the name when there is no id, else as the description. */
  label?: string;
  description?: string;
  connector?: string;
  pin?: string;
}

export interface ConnectorInput {
  name: string;
  pins: { pin: string; net: string; function?: string }[];
}

/** Pin words by element kind and node position (SPICE node order). */
const PIN_WORDS: Partial<Record<string, readonly string[]>> = {
  C: ['+', '−'],
  D: ['anode', 'cathode'],
  Q: ['collector', 'base', 'emitter'],
  R: ['pin 1', 'pin 2'],
  L: ['pin 1', 'pin 2'],
};
const OPTO_PORTS: Readonly<Record<number, string>> = { 0: 'LED anode', 1: 'LED cathode', 2: 'collector', 3: 'emitter' };

/** Preference of the part whose pin names a net without a test point: big pads and clear polarity first. */
const PIN_RANK: Partial<Record<PartKind, number>> = {
  'electrolytic-capacitor': 0,
  'ceramic-capacitor': 1,
  diode: 2,
  led: 3,
  resistor: 4,
  bjt: 5,
  regulator: 6,
  'opto-coupler': 7,
  inductor: 8,
  subcircuit: 9,
};

export interface PinPart {
  part: ElectricalPart;
  designator: string;
  /** Element letter of the netlist line (R, C, D, Q, X). */
  letter: string;
  /** The netlist line's nodes (lower case, 0 for ground) and, for X, the subcircuit's port names. */
  nodes: readonly string[];
  ports?: readonly string[];
  /** Element value (capacitance, resistance) to prefer the biggest capacitor. */
  value?: number;
}

/** "C10 +", "Q1 collector", "U1 LED anode", "U201 out": the pin of `p` on `net`. */
export function pinName(p: PinPart, net: string): string {
  const i = p.nodes.indexOf(net);
  if (p.letter === 'X') {
    if (p.part.kind === 'opto-coupler' && OPTO_PORTS[i]) return `${p.designator} ${OPTO_PORTS[i]}`;
    const port = p.ports?.[i];
    return port ? `${p.designator} ${port.toLowerCase()}` : `${p.designator} pin ${i + 1}`;
  }
  const words = PIN_WORDS[p.letter];
  return `${p.designator} ${words?.[i] ?? `pin ${i + 1}`}`;
}

/**
 * The nearest part pin of a net: the best-ranked part on it (biggest capacitor first), ties by designator. Parts
 * in `prefer` come first (the bulk capacitor for the reference: its negative pin is where the bench checks the
 * bus discharge).
 */
export function nearestPin(net: string, parts: readonly PinPart[], prefer?: ReadonlySet<string>): ProbePoint | undefined {
  const on = parts.filter((p) => p.part.kind !== 'source' && p.nodes.includes(net));
  const pref = (p: PinPart) => (prefer?.has(p.part.name) ? 0 : 1);
  on.sort(
    (a, b) =>
      pref(a) - pref(b) ||
      (PIN_RANK[a.part.kind] ?? 10) - (PIN_RANK[b.part.kind] ?? 10) ||
      (b.value ?? 0) - (a.value ?? 0) ||
      a.designator.localeCompare(b.designator, undefined, { numeric: true }),
  );
  const best = on[0];
  if (!best) return undefined;
  const label = pinName(best, net);
  return { label, description: net === '0' ? 'ground (reference)' : 'no test point on this net: the pin of the nearest part', said: label };
}

/** Names a net as the bench finds it (see the header). */
export function probePoint(
  net: string,
  points: readonly NamedTestPoint[],
  connectors: readonly ConnectorInput[],
  parts: readonly PinPart[],
  prefer?: ReadonlySet<string>,
): ProbePoint {
  const tp = points.find((p) => p.net === net && (p.id || p.label));
  if (tp) {
    const name = tp.id ?? (tp.label as string);
    const label = tp.connector && tp.pin ? `${name} (${tp.connector} pin ${tp.pin})` : name;
    const description = tp.description ?? (tp.id ? tp.label : undefined);
    return description ? { label, description, said: `${label} ${description}` } : { label, said: label };
  }
  // The reference is the bulk capacitor's negative pin where the board has one: the pin the discharge check
  // uses, before a connector's ground pin.
  const reference =
    net === '0' && prefer?.size
      ? nearestPin(
          net,
          parts.filter((p) => prefer.has(p.part.name)),
        )
      : undefined;
  if (reference) return reference;
  for (const c of connectors) {
    const pin = c.pins.find((p) => p.net.toLowerCase() === net);
    const label = pin && `${c.name} pin ${pin.pin}`;
    if (pin && label) return { label, ...(pin.function ? { description: pin.function } : {}), said: label };
  }
  const none = net === '0' ? 'ground' : 'an unlabelled point';
  return nearestPin(net, parts, net === '0' ? prefer : undefined) ?? { label: none, description: 'no test point or part pin on this net', said: none };
}
