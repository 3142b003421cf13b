/**
 * The netlist parser: cards to a Netlist (models, parameters, subcircuit definitions, elements), with the commands
 * of the accepted subset checked. Element cards: element-card.ts; text to cards: cards.ts.
 */
import { splitAssignment, toCards, type Card } from './cards';
import { parseElement } from './element-card';
import { NetlistError, type ModelDef, type ParamDef, type SubcktDef, type Netlist, type RawValue } from './netlist-types';
import { parseSpiceNumber } from './values';

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
        throw new NetlistError(
          card.line,
          `unsupported command "${card.tokens[0]}" (DC operating point subset: .model .subckt .ends .param .options .temp .end; analyses and outputs are ignored)`,
        );
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
