/** The parsed netlist as written (before flattening): its types and the error every parse and flatten step throws. */
/** A parse or flatten error; `message` always starts with "line N: " when a line is known. */
export class NetlistError extends Error {
  readonly line: number;
  constructor(line: number, message: string) {
    super(line > 0 ? `line ${line}: ${message}` : message);
    this.name = 'NetlistError';
    this.line = line;
  }
}

/** A value as written: a literal number or a `{expression}` (or bare parameter name) evaluated at flatten time. */
export type RawValue = { kind: 'number'; value: number } | { kind: 'expr'; expr: string };

export type ElementLetter = 'R' | 'C' | 'L' | 'V' | 'I' | 'D' | 'Q' | 'E' | 'F' | 'G' | 'H' | 'X';

export interface RawElement {
  /** Name as written, e.g. "R1", "XU1". */
  name: string;
  letter: ElementLetter;
  /** Node names lower-case as written ("gnd" is kept; flatten maps it to "0"). */
  nodes: string[];
  /** R C L V I value, E G gain, F H gain; D/Q area (default 1). */
  value?: RawValue;
  /** D and Q: model name (lower-case). X: subcircuit name (lower-case). */
  model?: string;
  /** F and H: controlling voltage source name (lower-case). */
  control?: string;
  /** X instance parameters (lower-case names). */
  params?: Record<string, RawValue>;
  /**
   * V and I with a time function (SIN, PULSE, PWL, EXP, SFFM) and no DC value: its name and arguments. The
   * operating point takes the function's value at time 0, as ngspice's .op does (vsrcload.c / isrcload.c: the DC
   * value when given, else the transient function at time 0).
   */
  wave?: { fn: string; args: RawValue[] };
  line: number;
}

export interface ModelDef {
  name: string;
  type: 'd' | 'npn' | 'pnp';
  params: Record<string, RawValue>;
  line: number;
}

export interface ParamDef {
  name: string;
  value: RawValue;
  line: number;
}

export interface SubcktDef {
  name: string;
  ports: string[];
  /** Default parameters from `params:` on the .subckt line. */
  params: ParamDef[];
  elements: RawElement[];
  models: Record<string, ModelDef>;
  subckts: Record<string, SubcktDef>;
  line: number;
}

/** A parsed netlist: the top level is a subcircuit without ports. */
export interface Netlist {
  title: string;
  elements: RawElement[];
  models: Record<string, ModelDef>;
  subckts: Record<string, SubcktDef>;
  /** Top-level `.param` definitions in order. */
  params: ParamDef[];
}
