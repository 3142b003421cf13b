import { parseSpiceNumber } from './values';

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

interface Card {
  tokens: string[];
  line: number;
}

/** Strips `;` and `$` inline comments (outside braces). */
function stripInlineComment(s: string): string {
  let depth = 0;
  for (let i = 0; i < s.length; i++) {
    const ch = s[i];
    if (ch === '{') depth++;
    else if (ch === '}') depth = Math.max(0, depth - 1);
    else if (depth === 0 && (ch === ';' || ch === '$')) return s.slice(0, i);
  }
  return s;
}

/** Splits a card into tokens: whitespace, commas and parentheses separate; `=` is its own token; braces stay whole. */
function tokenize(s: string, line: number): string[] {
  const out: string[] = [];
  let cur = '';
  let depth = 0;
  const flush = () => {
    if (cur !== '') out.push(cur);
    cur = '';
  };
  for (const ch of s) {
    if (depth > 0) {
      cur += ch;
      if (ch === '{') depth++;
      else if (ch === '}') {
        depth--;
        if (depth === 0) flush();
      }
      continue;
    }
    if (ch === '{') {
      flush();
      cur = '{';
      depth = 1;
    } else if (/\s/.test(ch) || ch === ',' || ch === '(' || ch === ')') flush();
    else if (ch === '=') {
      flush();
      out.push('=');
    } else cur += ch;
  }
  if (depth > 0) throw new NetlistError(line, `unbalanced "{" in "${s.trim()}"`);
  flush();
  return out;
}

/** Joins `k = v` token triples into "k=v" tokens. */
function joinAssignments(tokens: string[], line: number): string[] {
  const out: string[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i] as string;
    if (t === '=') {
      const prev = out.pop();
      const next = tokens[i + 1];
      if (prev === undefined || next === undefined || next === '=') throw new NetlistError(line, 'misplaced "="');
      out.push(`${prev}=${next}`);
      i++;
    } else out.push(t);
  }
  return out;
}

function toCards(text: string, firstIsTitle: boolean): { title: string; cards: Card[] } {
  const lines = text.split(/\r?\n/);
  const cards: Card[] = [];
  let title = '';
  let pending: { text: string; line: number } | undefined;
  const push = () => {
    if (!pending) return;
    const tokens = joinAssignments(tokenize(pending.text, pending.line), pending.line);
    if (tokens.length > 0) cards.push({ tokens, line: pending.line });
    pending = undefined;
  };
  let inControl = false;
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i] as string;
    const lineNo = i + 1;
    if (i === 0 && firstIsTitle) {
      title = raw.trim();
      continue;
    }
    const trimmed = raw.trim();
    if (inControl) {
      if (/^\.endc\b/i.test(trimmed)) inControl = false;
      continue;
    }
    if (/^\.control\b/i.test(trimmed)) {
      push();
      inControl = true;
      continue;
    }
    if (trimmed === '' || trimmed.startsWith('*')) continue;
    if (trimmed.startsWith('+')) {
      const rest = stripInlineComment(trimmed.slice(1));
      if (!pending) throw new NetlistError(lineNo, 'continuation line "+" with nothing to continue');
      pending.text += ' ' + rest;
      continue;
    }
    push();
    pending = { text: stripInlineComment(trimmed), line: lineNo };
  }
  push();
  return { title, cards };
}

function rawValue(token: string, line: number, what: string): RawValue {
  if (token.startsWith('{')) {
    if (!token.endsWith('}')) throw new NetlistError(line, `${what}: unbalanced braces in "${token}"`);
    const expr = token.slice(1, -1).trim();
    if (expr === '') throw new NetlistError(line, `${what}: empty expression "{}"`);
    return { kind: 'expr', expr };
  }
  const n = parseSpiceNumber(token);
  if (n !== undefined) return { kind: 'number', value: n };
  if (/^[A-Za-z_][\w]*$/.test(token)) return { kind: 'expr', expr: token };
  throw new NetlistError(line, `${what}: "${token}" is not a number or {expression}`);
}

function splitAssignment(tok: string, line: number, what: string): [string, RawValue] {
  const eq = tok.indexOf('=');
  const key = tok.slice(0, eq).toLowerCase();
  const val = tok.slice(eq + 1);
  if (key === '' || val === '') throw new NetlistError(line, `${what}: bad assignment "${tok}"`);
  return [key, rawValue(val, line, `${what} ${key}`)];
}

/** Time functions of independent sources whose value at time 0 is the operating-point value (ngspice manual 4.1). */
const WAVES = new Set(['sin', 'pulse', 'pwl', 'exp', 'sffm']);

const USAGE: Record<ElementLetter, string> = {
  R: 'needs 2 nodes and a value',
  C: 'needs 2 nodes and a value',
  L: 'needs 2 nodes and a value',
  V: 'needs 2 nodes and an optional DC value',
  I: 'needs 2 nodes and an optional DC value',
  D: 'needs 2 nodes and a model name',
  Q: 'needs 3 nodes and a model name',
  E: 'needs 4 nodes and a gain',
  G: 'needs 4 nodes and a gain',
  F: 'needs 2 nodes, a controlling V source and a gain',
  H: 'needs 2 nodes, a controlling V source and a gain',
  X: 'needs its nodes and a subcircuit name',
};

function validNode(n: string): boolean {
  return /^[^\s{}=]+$/.test(n);
}

function parseElement(card: Card): RawElement {
  const [nameTok, ...rest] = card.tokens as [string, ...string[]];
  const letter = nameTok[0]?.toUpperCase() as ElementLetter;
  const line = card.line;
  if (!(letter in USAGE)) {
    throw new NetlistError(line, `unknown element "${nameTok}" (supported: R C L V I D Q E F G H X)`);
  }
  const name = nameTok;
  const bad = (): never => {
    throw new NetlistError(line, `${name} ${USAGE[letter]}`);
  };
  const lc = rest.map((t) => t.toLowerCase());
  const nodesOf = (k: number) => {
    const nodes = lc.slice(0, k);
    if (nodes.length < k || nodes.some((n) => !validNode(n) || n.includes('='))) bad();
    return nodes;
  };
  switch (letter) {
    case 'R':
    case 'C':
    case 'L': {
      const nodes = nodesOf(2);
      const positional = rest.slice(2).filter((t) => !t.includes('='));
      const kv = rest.slice(2).filter((t) => t.includes('='));
      let valTok = positional[0];
      for (const t of kv) {
        const [k] = t.split('=');
        if (k?.toLowerCase() === letter.toLowerCase() || k?.toLowerCase() === 'value') valTok = t.slice(t.indexOf('=') + 1);
      }
      if (valTok === undefined) bad();
      if (positional.length > 1) throw new NetlistError(line, `${name}: unexpected "${positional[1]}" after the value`);
      return { name, letter, nodes, value: rawValue(valTok as string, line, name), line };
    }
    case 'V':
    case 'I': {
      const nodes = nodesOf(2);
      const args = rest.slice(2);
      let value: RawValue = { kind: 'number', value: 0 };
      let wave: RawElement['wave'];
      let i = 0;
      let seen = false;
      while (i < args.length) {
        const t = (args[i] as string).toLowerCase();
        if (t === 'dc') {
          const v = args[i + 1];
          if (v === undefined) throw new NetlistError(line, `${name}: DC needs a value`);
          value = rawValue(v, line, name);
          seen = true;
          i += 2;
        } else if (t === 'ac') {
          // AC magnitude/phase do not affect the DC operating point; skip up to two numbers.
          i++;
          for (let k = 0; k < 2 && i < args.length && parseSpiceNumber(args[i] as string) !== undefined; k++) i++;
        } else if (WAVES.has(t)) {
          i++;
          const fargs: RawValue[] = [];
          for (; i < args.length; i++) {
            const a = args[i] as string;
            if (a.includes('=')) continue; // PWL r= / td= options: the value at time 0 is the first point's either way
            if (parseSpiceNumber(a) === undefined && !a.startsWith('{')) break;
            fargs.push(rawValue(a, line, `${name} ${t.toUpperCase()}`));
          }
          wave = { fn: t, args: fargs };
        } else if (!seen && (parseSpiceNumber(t) !== undefined || t.startsWith('{') || /^[a-z_]\w*$/.test(t))) {
          if (/^[a-z_]\w*$/.test(t) && parseSpiceNumber(t) === undefined && /^(am|trnoise|trrandom|external|distof[12])$/.test(t)) {
            throw new NetlistError(line, `${name}: source function "${args[i]}" is not supported (DC, SIN, PULSE, PWL, EXP, SFFM)`);
          }
          value = rawValue(args[i] as string, line, name);
          seen = true;
          i++;
        } else {
          throw new NetlistError(line, `${name}: unexpected "${args[i]}" (DC value, AC, SIN, PULSE, PWL, EXP or SFFM expected)`);
        }
      }
      return seen || !wave ? { name, letter, nodes, value, line } : { name, letter, nodes, value, wave, line };
    }
    case 'D': {
      const nodes = nodesOf(2);
      const model = lc[2];
      if (model === undefined || model.includes('=')) bad();
      const area = rest[3];
      return {
        name,
        letter,
        nodes,
        model,
        value: area !== undefined && !area.includes('=') ? rawValue(area, line, `${name} area`) : { kind: 'number', value: 1 },
        line,
      };
    }
    case 'Q': {
      // Q c b e [substrate] model [area]; the model position is resolved after parsing (models may come later).
      const positional = lc.filter((t) => !t.includes('='));
      if (positional.length < 4) bad();
      return { name, letter, nodes: positional.slice(0, 3), model: positional.slice(3).join(' '), line };
    }
    case 'E':
    case 'G': {
      const nodes = nodesOf(4);
      const g = rest[4];
      if (g === undefined) bad();
      if (rest.length > 5) throw new NetlistError(line, `${name}: only linear ${letter} sources "n+ n- nc+ nc- gain" are supported`);
      return { name, letter, nodes, value: rawValue(g as string, line, `${name} gain`), line };
    }
    case 'F':
    case 'H': {
      const nodes = nodesOf(2);
      const control = lc[2];
      const g = rest[3];
      if (control === undefined || g === undefined) bad();
      return { name, letter, nodes, control, value: rawValue(g as string, line, `${name} gain`), line };
    }
    case 'X': {
      const params: Record<string, RawValue> = {};
      const positional: string[] = [];
      let inParams = false;
      for (const t of rest) {
        if (t.toLowerCase() === 'params:') {
          inParams = true;
          continue;
        }
        if (t.includes('=')) {
          const [k, v] = splitAssignment(t, line, name);
          params[k] = v;
        } else if (inParams) throw new NetlistError(line, `${name}: expected name=value after params:`);
        else positional.push(t.toLowerCase());
      }
      if (positional.length < 1) bad();
      const sub = positional.pop() as string;
      return { name, letter, nodes: positional, model: sub, params, line };
    }
  }
  return bad();
}

function parseModel(card: Card): ModelDef {
  const [, nameTok, typeTok, ...rest] = card.tokens;
  if (nameTok === undefined || typeTok === undefined) throw new NetlistError(card.line, '.model needs a name and a type (D, NPN or PNP)');
  const type = typeTok.toLowerCase();
  if (type !== 'd' && type !== 'npn' && type !== 'pnp') {
    throw new NetlistError(card.line, `.model ${nameTok}: unsupported type "${typeTok}" (supported: D, NPN, PNP)`);
  }
  const params: Record<string, RawValue> = {};
  for (const t of rest) {
    if (!t.includes('=')) throw new NetlistError(card.line, `.model ${nameTok}: expected name=value, found "${t}"`);
    const [k, v] = splitAssignment(t, card.line, `.model ${nameTok}`);
    params[k] = v;
  }
  return { name: nameTok.toLowerCase(), type, params, line: card.line };
}

function parseParams(tokens: string[], line: number, what: string): ParamDef[] {
  const out: ParamDef[] = [];
  for (const t of tokens) {
    if (t.toLowerCase() === 'params:') continue;
    if (!t.includes('=')) throw new NetlistError(line, `${what}: expected name=value, found "${t}"`);
    const [k, v] = splitAssignment(t, line, what);
    if (!/^[a-z_][\w]*$/.test(k)) throw new NetlistError(line, `${what}: "${k}" is not a valid parameter name`);
    out.push({ name: k, value: v, line });
  }
  return out;
}

/**
 * Commands accepted and ignored: analyses and outputs do not change the circuit, and every analysis starts from the
 * DC operating point this package computes (ngspice manual ch. 15, "Analyses": .ac, .tf, .noise, .tran start from
 * the .op). `.options` and `.temp` are checked (checkOptions). Anything else is refused naming the command.
 */
const IGNORED_DOT = new Set([
  '.op',
  '.title',
  '.tran',
  '.ac',
  '.dc',
  '.tf',
  '.noise',
  '.disto',
  '.sens',
  '.pz',
  '.four',
  '.print',
  '.plot',
  '.save',
  '.probe',
  '.width',
  '.meas',
  '.measure',
]);

/** Nominal temperature, °C: the only one the models are evaluated at (ngspice default TEMP = TNOM = 27 °C). */
export const NOMINAL_TEMP = 27;

/**
 * `.options` / `.temp`: options that change the operating point (TEMP, TNOM other than 27 °C, GMIN other than 1e-12,
 * RSHUNT/GSHUNT) are refused; tolerances, iteration limits and output options only steer or print and are ignored.
 */
function checkOptions(card: Card, first: string): void {
  const refuse = (what: string) => {
    throw new NetlistError(card.line, `${card.tokens[0]}: ${what} is not supported (the DC models are evaluated at 27 °C with GMIN 1e-12 S)`);
  };
  if (first === '.temp') {
    const t = parseSpiceNumber(card.tokens[1] ?? '');
    if (t !== NOMINAL_TEMP) refuse(`temperature ${card.tokens[1] ?? '(none)'}`);
    return;
  }
  for (const tok of card.tokens.slice(1)) {
    const eq = tok.indexOf('=');
    const key = (eq < 0 ? tok : tok.slice(0, eq)).toLowerCase();
    const v = eq < 0 ? undefined : parseSpiceNumber(tok.slice(eq + 1));
    if ((key === 'temp' || key === 'tnom') && v !== NOMINAL_TEMP) refuse(`${key.toUpperCase()}=${tok.slice(eq + 1)}`);
    if (key === 'gmin' && v !== 1e-12) refuse(`GMIN=${tok.slice(eq + 1)}`);
    if (key === 'rshunt' || key === 'gshunt') refuse(key.toUpperCase());
  }
}

export interface ParseOptions {
  /**
   * SPICE3 treats the first line of a netlist file as its title (default true). Pass false for
   * fragments that start directly with element lines.
   */
  title?: boolean;
}

/**
 * Parses a Berkeley SPICE3 netlist (the DC subset: R C L V I D Q E F G H X, .model, .subckt/.ends, .param,
 * .op, .end). As in SPICE3 the first line is the title unless `options.title === false`.
 * Throws NetlistError naming the line on any problem.
 */
export function parseNetlist(text: string, options: ParseOptions = {}): Netlist {
  const { title, cards } = toCards(text, options.title !== false);
  const top: SubcktDef = { name: '', ports: [], params: [], elements: [], models: {}, subckts: {}, line: 0 };
  const stack: SubcktDef[] = [top];
  for (const card of cards) {
    const first = (card.tokens[0] as string).toLowerCase();
    const scope = stack[stack.length - 1] as SubcktDef;
    if (first.startsWith('.')) {
      if (first === '.end') break;
      if (IGNORED_DOT.has(first)) continue;
      if (first === '.options' || first === '.option' || first === '.opt' || first === '.temp') {
        checkOptions(card, first);
        continue;
      }
      if (first === '.model') {
        const m = parseModel(card);
        scope.models[m.name] = m;
      } else if (first === '.param') {
        const ps = parseParams(card.tokens.slice(1), card.line, '.param');
        if (ps.length === 0) throw new NetlistError(card.line, '.param needs name=value');
        if (stack.length > 1) scope.params.push(...ps);
        else top.params.push(...ps);
      } else if (first === '.subckt') {
        const nameTok = card.tokens[1];
        if (nameTok === undefined) throw new NetlistError(card.line, '.subckt needs a name and its ports');
        const after = card.tokens.slice(2);
        const pIdx = after.findIndex((t) => t.includes('=') || t.toLowerCase() === 'params:');
        const ports = (pIdx < 0 ? after : after.slice(0, pIdx)).map((t) => t.toLowerCase());
        const params = pIdx < 0 ? [] : parseParams(after.slice(pIdx), card.line, `.subckt ${nameTok}`);
        const def: SubcktDef = { name: nameTok.toLowerCase(), ports, params, elements: [], models: {}, subckts: {}, line: card.line };
        if (ports.some((p) => p === '0' || p === 'gnd')) throw new NetlistError(card.line, `.subckt ${nameTok}: the reference node cannot be a port`);
        if (new Set(ports).size !== ports.length) throw new NetlistError(card.line, `.subckt ${nameTok}: duplicate port name`);
        scope.subckts[def.name] = def;
        stack.push(def);
      } else if (first === '.ends') {
        if (stack.length === 1) throw new NetlistError(card.line, '.ends without .subckt');
        const def = stack.pop() as SubcktDef;
        const n = card.tokens[1]?.toLowerCase();
        if (n !== undefined && n !== def.name) throw new NetlistError(card.line, `.ends ${card.tokens[1]} does not match .subckt ${def.name}`);
      } else {
        throw new NetlistError(card.line, `unsupported command "${card.tokens[0]}" (DC operating point subset: .model .subckt .ends .param .options .temp .end; analyses and outputs are ignored)`);
      }
      continue;
    }
    const el = parseElement(card);
    if (scope.elements.some((e) => e.name.toLowerCase() === el.name.toLowerCase())) {
      throw new NetlistError(card.line, `duplicate element name "${el.name}"`);
    }
    scope.elements.push(el);
  }
  if (stack.length > 1) {
    const open = stack[stack.length - 1] as SubcktDef;
    throw new NetlistError(open.line, `.subckt ${open.name} has no .ends`);
  }
  return { title, elements: top.elements, models: top.models, subckts: top.subckts, params: top.params };
}
