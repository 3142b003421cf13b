/** Flat circuit: plain data that callers may copy and edit (replace, remove or add elements) before solving. */

/** Diode model parameters (SPICE level-1 DC subset). */
export interface DiodeModel {
  /** Saturation current, A (SPICE default 1e-14). */
  is: number;
  /** Emission coefficient (default 1). */
  n: number;
  /** Series resistance, ohm (default 0; > 0 adds an internal node "<name>#int"). */
  rs: number;
  /** Reverse breakdown voltage, V (default Infinity = none). */
  bv: number;
  /** Current at breakdown voltage, A (default 1e-3 as in SPICE). */
  ibv: number;
}

/**
 * BJT model parameters: the DC part of the Gummel–Poon model as ngspice implements it (ngspice manual, "BJT
 * models"; source src/spicelib/devices/bjt/bjtload.c; Massobrio & Antognetti, "Semiconductor Device Modeling with
 * SPICE", 2nd ed., ch. 2).
 */
export interface BjtModel {
  type: 'npn' | 'pnp';
  is: number;
  bf: number;
  br: number;
  nf: number;
  nr: number;
  /** Base / collector / emitter ohmic resistances, ohm (0 = none; > 0 adds internal nodes "<name>#b" etc.). */
  rb: number;
  rc: number;
  re: number;
  /** Forward / reverse Early voltages, V (Infinity = none). */
  vaf: number;
  var: number;
  /** Forward / reverse high-injection knee currents, A (Infinity = none). */
  ikf: number;
  ikr: number;
  /** Exponent of the high-injection roll-off (ngspice NKF, default 0.5). */
  nkf: number;
  /** B–E leakage saturation current and emission coefficient (default 0, 1.5). */
  ise: number;
  ne: number;
  /** B–C leakage saturation current and emission coefficient (default 0, 2). */
  isc: number;
  nc: number;
  /** Minimum base resistance at high current, ohm (NaN = RB, the default) and the current where RB falls halfway, A (Infinity = none). */
  rbm: number;
  irb: number;
  /** Substrate connection (ngspice SUBS): 1 vertical, from the collector (NPN default); −1 lateral, from the base (PNP default). */
  subs: 1 | -1;
}

interface Base {
  /** Flat name: instance path + "." + name as written, e.g. "XU1.DL". */
  name: string;
  /** Top-level part name ("XU1" for "XU1.DL"; "R1" for "R1"). */
  part: string;
}

export interface ResistorElement extends Base {
  kind: 'R';
  nodes: [string, string];
  value: number;
}
export interface CapacitorElement extends Base {
  kind: 'C';
  nodes: [string, string];
  value: number;
}
export interface InductorElement extends Base {
  kind: 'L';
  nodes: [string, string];
  value: number;
}
/** Independent DC source; current flows from nodes[0] through the source to nodes[1] (SPICE convention). */
export interface VSourceElement extends Base {
  kind: 'V';
  nodes: [string, string];
  value: number;
}
export interface ISourceElement extends Base {
  kind: 'I';
  nodes: [string, string];
  value: number;
}
export interface DiodeElement extends Base {
  kind: 'D';
  /** [anode, cathode] */
  nodes: [string, string];
  model: DiodeModel;
  area: number;
}
export interface BjtElement extends Base {
  kind: 'Q';
  /** [collector, base, emitter] */
  nodes: [string, string, string];
  /** Substrate node (default the reference): only a GMIN reaches it at DC (ngspice's substrate junction, ISS = 0). */
  substrate?: string;
  model: BjtModel;
  area: number;
}
/** VCVS (E) / VCCS (G): nodes [n+, n-, nc+, nc-]. */
export interface VcvsElement extends Base {
  kind: 'E';
  nodes: [string, string, string, string];
  gain: number;
}
export interface VccsElement extends Base {
  kind: 'G';
  nodes: [string, string, string, string];
  gain: number;
}
/** CCCS (F) / CCVS (H): controlled by the branch current of the flat V element named `control`. */
export interface CccsElement extends Base {
  kind: 'F';
  nodes: [string, string];
  control: string;
  gain: number;
}
export interface CcvsElement extends Base {
  kind: 'H';
  nodes: [string, string];
  control: string;
  gain: number;
}

export type Element =
  | ResistorElement
  | CapacitorElement
  | InductorElement
  | VSourceElement
  | ISourceElement
  | DiodeElement
  | BjtElement
  | VcvsElement
  | VccsElement
  | CccsElement
  | CcvsElement;

export interface Circuit {
  title: string;
  elements: Element[];
  /**
   * Every net of the netlist as written (lower-case, "0" is the reference). Nets that lose all their elements
   * in a derived state (a lifted part) are still known, so probing them reads like an isolated pad.
   */
  nets: string[];
  /** Parameter values used (lower-case names). */
  params: Record<string, number>;
}

export const REFERENCE = '0';

/**
 * Normalises a node name: trimmed, lower-case, "gnd" → "0". The one spelling of a net everywhere (the diagnosis
 * engine, the expected table, the server's probe names): nothing else writes this rule again.
 */
export function normNode(n: string): string {
  const l = n.trim().toLowerCase();
  return l === 'gnd' ? REFERENCE : l;
}

/** Deep copy of a circuit (models are copied too, so edits never leak into the original). */
export function cloneCircuit(c: Circuit): Circuit {
  return {
    title: c.title,
    nets: [...c.nets],
    params: { ...c.params },
    elements: c.elements.map((e) => cloneElement(e)),
  };
}

export function cloneElement<T extends Element>(e: T): T {
  const copy = { ...e, nodes: [...e.nodes] } as T;
  if (copy.kind === 'D' || copy.kind === 'Q') (copy as DiodeElement | BjtElement).model = { ...(e as DiodeElement | BjtElement).model } as never;
  return copy;
}

/** Builds a flat resistor (e.g. a short fault = 0.01 ohm, an open = 1e12 ohm). */
export function resistor(name: string, a: string, b: string, ohms: number, part = name.split('.')[0] ?? name): ResistorElement {
  return { kind: 'R', name, part, nodes: [normNode(a), normNode(b)], value: ohms };
}

/** Builds a flat independent DC voltage source. */
export function vsource(name: string, plus: string, minus: string, volts: number, part = name.split('.')[0] ?? name): VSourceElement {
  return { kind: 'V', name, part, nodes: [normNode(plus), normNode(minus)], value: volts };
}

/** Builds a flat independent DC current source (current flows from `from` through the source to `to`). */
export function isource(name: string, from: string, to: string, amps: number, part = name.split('.')[0] ?? name): ISourceElement {
  return { kind: 'I', name, part, nodes: [normNode(from), normNode(to)], value: amps };
}

export const DEFAULT_DIODE: DiodeModel = { is: 1e-14, n: 1, rs: 0, bv: Infinity, ibv: 1e-3 };
export const DEFAULT_BJT: Omit<BjtModel, 'type'> = {
  is: 1e-16,
  bf: 100,
  br: 1,
  nf: 1,
  nr: 1,
  rb: 0,
  rc: 0,
  re: 0,
  vaf: Infinity,
  var: Infinity,
  ikf: Infinity,
  ikr: Infinity,
  nkf: 0.5,
  ise: 0,
  ne: 1.5,
  isc: 0,
  nc: 2,
  rbm: NaN,
  irb: Infinity,
  subs: 1,
};

/** Builds a flat diode with the given model parameters (SPICE defaults for the rest). */
export function diode(name: string, anode: string, cathode: string, model: Partial<DiodeModel> = {}, part = name.split('.')[0] ?? name): DiodeElement {
  return { kind: 'D', name, part, nodes: [normNode(anode), normNode(cathode)], model: { ...DEFAULT_DIODE, ...model }, area: 1 };
}

/** Removes the elements of the given parts (top-level names, case-insensitive) and returns a new circuit. */
export function withoutParts(c: Circuit, parts: readonly string[]): Circuit {
  const set = new Set(parts.map((p) => p.toLowerCase()));
  return { ...c, elements: c.elements.filter((e) => !set.has(e.part.toLowerCase())) };
}
