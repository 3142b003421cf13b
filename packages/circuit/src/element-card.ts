/** One element card (R C L V I D Q E F G H X) to a RawElement, with the SPICE3 syntax of each letter. */
import { rawValue, splitAssignment, type Card } from './cards';
import { NetlistError, type ElementLetter, type RawElement, type RawValue } from './netlist-types';
import { parseSpiceNumber } from './values';

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

export function parseElement(card: Card): RawElement {
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
