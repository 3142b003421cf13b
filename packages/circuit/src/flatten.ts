import type { Circuit, Element } from './circuit';
import { normNode, REFERENCE } from './circuit';
import { bjtModel, diodeModel } from './models';
import { NetlistError, type ModelDef, type Netlist, type ParamDef, type RawElement, type RawValue, type SubcktDef } from './netlist-types';
import { nodesWithoutDcPath } from './topology';
import { evalExpr } from './expressions';

function value(v: RawValue, scope: Map<string, number>, line: number, what: string): number {
  return v.kind === 'number' ? v.value : evalExpr(v.expr, scope, line, what);
}

function evalParams(defs: readonly ParamDef[], scope: Map<string, number>, overrides: Record<string, number> | undefined): void {
  for (const p of defs) {
    const o = overrides?.[p.name];
    scope.set(p.name, o !== undefined ? o : value(p.value, scope, p.line, `.param ${p.name}`));
  }
}

interface Scope {
  def: SubcktDef;
  /** Chain of enclosing definitions for model/subckt lookup (innermost first). */
  lexical: SubcktDef[];
  params: Map<string, number>;
  /** Instance path as written ("XU1.XQ2") and lower-case node prefix ("xu1.xq2"). */
  path: string;
  prefix: string;
  part: string | undefined;
  portMap: Map<string, string>;
  depth: number;
}

function lookupModel(scope: Scope, name: string): ModelDef | undefined {
  for (const d of scope.lexical) {
    const m = d.models[name];
    if (m) return m;
  }
  return undefined;
}

function lookupSubckt(scope: Scope, name: string): SubcktDef | undefined {
  for (const d of scope.lexical) {
    const s = d.subckts[name];
    if (s) return s;
  }
  return undefined;
}

/** A model card's parameters evaluated in the instance's scope. */
function modelEval(m: ModelDef, params: Map<string, number>): (key: string) => number {
  return (k) => value(m.params[k] as RawValue, params, m.line, `.model ${m.name} ${k}`);
}

/**
 * Value at time 0 of a source's time function (ngspice vsrcload.c, the .op value when no DC value is given):
 * SIN(VO VA FREQ TD THETA PHASE) → VO + VA·sin(PHASE°); PULSE(V1 …), EXP(V1 …) → V1; PWL(T1 V1 …) → V1;
 * SFFM(VO VA …) → VO.
 */
function waveAtZero(w: NonNullable<RawElement['wave']>, p: Map<string, number>, raw: RawElement): number {
  const arg = (i: number) => {
    const a = w.args[i];
    return a === undefined ? 0 : value(a, p, raw.line, `${raw.name} ${w.fn.toUpperCase()}`);
  };
  if (w.args.length === 0) throw new NetlistError(raw.line, `${raw.name}: ${w.fn.toUpperCase()} needs its arguments`);
  if (w.fn === 'sin') return arg(0) + arg(1) * Math.sin((arg(5) * Math.PI) / 180);
  if (w.fn === 'pwl') return arg(1);
  return arg(0);
}

export interface FlattenOptions {
  /** Check that every node has a DC path to the reference (default true; the netlist as written must). */
  checkDcPaths?: boolean;
}

/**
 * Expands subcircuit instances (nested), evaluates parameters and {expressions} with mathjs and resolves models.
 * `params` overrides top-level `.param` values (case-insensitive names).
 */
export function flatten(netlist: Netlist, params?: Record<string, number>, options: FlattenOptions = {}): Circuit {
  const overrides: Record<string, number> = {};
  for (const [k, v] of Object.entries(params ?? {})) overrides[k.toLowerCase()] = v;
  const top: SubcktDef = { name: '', ports: [], params: netlist.params, elements: netlist.elements, models: netlist.models, subckts: netlist.subckts, line: 0 };
  const topParams = new Map<string, number>();
  evalParams(netlist.params, topParams, overrides);
  for (const [k, v] of Object.entries(overrides)) if (!topParams.has(k)) topParams.set(k, v);

  const elements: Element[] = [];
  const nets = new Set<string>([REFERENCE]);
  const vNames = new Set<string>();
  const pendingControls: { el: Element & { control: string }; line: number; prefix: string; raw: string }[] = [];

  const walk = (scope: Scope) => {
    const node = (n: string): string => {
      const l = normNode(n);
      if (l === REFERENCE) return REFERENCE;
      const mapped = scope.portMap.get(l);
      if (mapped !== undefined) return mapped;
      const full = scope.prefix ? `${scope.prefix}.${l}` : l;
      nets.add(full);
      return full;
    };
    for (const raw of scope.def.elements) {
      const name = scope.path ? `${scope.path}.${raw.name}` : raw.name;
      const part = scope.part ?? raw.name;
      const p = scope.params;
      const val = (what = raw.name) => value(raw.value as RawValue, p, raw.line, what);
      const n = raw.nodes.map(node);
      switch (raw.letter) {
        case 'R': {
          const v = val();
          if (v === 0) throw new NetlistError(raw.line, `${raw.name}: resistance must not be 0`);
          elements.push({ kind: 'R', name, part, nodes: [n[0] as string, n[1] as string], value: v });
          break;
        }
        case 'C':
        case 'L':
          elements.push({ kind: raw.letter, name, part, nodes: [n[0] as string, n[1] as string], value: val() });
          break;
        case 'V':
        case 'I':
          elements.push({ kind: raw.letter, name, part, nodes: [n[0] as string, n[1] as string], value: raw.wave ? waveAtZero(raw.wave, p, raw) : val() });
          if (raw.letter === 'V') vNames.add(name.toLowerCase());
          break;
        case 'E':
        case 'G':
          elements.push({ kind: raw.letter, name, part, nodes: [n[0], n[1], n[2], n[3]] as [string, string, string, string], gain: val(`${raw.name} gain`) });
          break;
        case 'F':
        case 'H': {
          const ctl = scope.path ? `${scope.path}.${raw.control as string}` : (raw.control as string);
          const el = { kind: raw.letter, name, part, nodes: [n[0], n[1]] as [string, string], control: ctl, gain: val(`${raw.name} gain`) };
          elements.push(el);
          pendingControls.push({ el, line: raw.line, prefix: scope.path, raw: raw.control as string });
          break;
        }
        case 'D': {
          const m = lookupModel(scope, raw.model as string);
          if (!m) throw new NetlistError(raw.line, `${raw.name}: model "${raw.model}" is not defined`);
          if (m.type !== 'd') throw new NetlistError(raw.line, `${raw.name}: model "${raw.model}" is ${m.type.toUpperCase()}, a diode needs a D model`);
          const area = val(`${raw.name} area`);
          elements.push({ kind: 'D', name, part, nodes: [n[0] as string, n[1] as string], model: diodeModel(m, modelEval(m, p)), area });
          break;
        }
        case 'Q': {
          const words = (raw.model as string).split(' ');
          let modelName: string;
          let areaTok: string | undefined;
          let substrate: string | undefined;
          if (words.length === 1) modelName = words[0] as string;
          else if (lookupModel(scope, words[0] as string)) {
            modelName = words[0] as string;
            areaTok = words[1];
          } else {
            modelName = words[1] as string;
            substrate = node(words[0] as string); // only a GMIN reaches it at DC
            areaTok = words[2];
          }
          const m = lookupModel(scope, modelName);
          if (!m) throw new NetlistError(raw.line, `${raw.name}: model "${modelName}" is not defined`);
          if (m.type === 'd') throw new NetlistError(raw.line, `${raw.name}: model "${modelName}" is a diode model, a transistor needs NPN or PNP`);
          let area = 1;
          if (areaTok !== undefined) {
            const a = Number(areaTok);
            if (!(a > 0)) throw new NetlistError(raw.line, `${raw.name}: bad area "${areaTok}"`);
            area = a;
          }
          const q: Element = { kind: 'Q', name, part, nodes: [n[0], n[1], n[2]] as [string, string, string], model: bjtModel(m, modelEval(m, p)), area };
          if (substrate !== undefined && substrate !== REFERENCE) q.substrate = substrate;
          elements.push(q);
          break;
        }
        case 'X': {
          const sub = lookupSubckt(scope, raw.model as string);
          if (!sub) throw new NetlistError(raw.line, `${raw.name}: subcircuit "${raw.model}" is not defined`);
          if (sub.ports.length !== raw.nodes.length) {
            throw new NetlistError(raw.line, `${raw.name}: subcircuit ${sub.name} has ${sub.ports.length} ports, ${raw.nodes.length} nodes given`);
          }
          if (scope.depth > 50) throw new NetlistError(raw.line, `${raw.name}: subcircuits nested too deeply (recursive definition?)`);
          const childParams = new Map(p);
          const inst = raw.params ?? {};
          for (const k of Object.keys(inst)) {
            if (!sub.params.some((d) => d.name === k)) throw new NetlistError(raw.line, `${raw.name}: subcircuit ${sub.name} has no parameter "${k}"`);
          }
          for (const d of sub.params) {
            const given = inst[d.name];
            childParams.set(
              d.name,
              given ? value(given, p, raw.line, `${raw.name} ${d.name}`) : value(d.value, childParams, d.line, `.subckt ${sub.name} ${d.name}`),
            );
          }
          const portMap = new Map<string, string>();
          sub.ports.forEach((port, i) => portMap.set(port, n[i] as string));
          walk({
            def: sub,
            lexical: [sub, ...scope.lexical],
            params: childParams,
            path: name,
            prefix: name.toLowerCase(),
            part,
            portMap,
            depth: scope.depth + 1,
          });
          break;
        }
      }
    }
  };
  walk({ def: top, lexical: [top], params: topParams, path: '', prefix: '', part: undefined, portMap: new Map(), depth: 0 });

  for (const pc of pendingControls) {
    if (!vNames.has(pc.el.control.toLowerCase())) {
      throw new NetlistError(pc.line, `${pc.el.name}: controlling voltage source "${pc.raw}" is not defined${pc.prefix ? ` in ${pc.prefix}` : ''}`);
    }
    const v = elements.find((e) => e.kind === 'V' && e.name.toLowerCase() === pc.el.control.toLowerCase());
    if (v) pc.el.control = v.name;
  }

  const circuit: Circuit = { title: netlist.title, elements, nets: [...nets], params: Object.fromEntries(topParams) };
  if (options.checkDcPaths !== false) {
    const islands = nodesWithoutDcPath(elements);
    if (islands.length > 0) {
      const el = findLine(netlist, islands[0] as string);
      const list = islands.slice(0, 5).join(', ') + (islands.length > 5 ? ', …' : '');
      throw new NetlistError(el, `node${islands.length > 1 ? 's' : ''} ${list} ha${islands.length > 1 ? 've' : 's'} no DC path to the reference (0)`);
    }
  }
  return circuit;
}

/** First line of a top-level element touching `node` (0 when it lies inside a subcircuit). */
function findLine(netlist: Netlist, node: string): number {
  const el: RawElement | undefined = netlist.elements.find((e) => e.nodes.some((n) => normNode(n) === node));
  return el?.line ?? 0;
}
