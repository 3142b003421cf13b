/**
 * Parts of a board and how their fault modes rewrite a flat circuit.
 *
 * A part is a top-level netlist element or subcircuit instance. Its kind comes from the case / board model or
 * is inferred from the element letter: R → resistor, C → ceramic capacitor (electrolytic from 1 µF), L →
 * inductor, D → diode, Q → bjt, X → opto-coupler when its subcircuit holds a diode and a current-controlled
 * source or a transistor sharing no node with the diode, else a generic subcircuit; V/I → source (no modes).
 * A subcircuit instance is one part whose modes are its internal elements' modes, named `element:mode` with
 * the internal element's name lower-cased as written (`dl:open`, `q1:ce-short`).
 */
import type { BjtElement, Circuit, Element, Netlist, RawElement, SubcktDef } from '@splitscope/circuit';
import { normNode } from '@splitscope/circuit';
import type { Component, SubFault } from '../core/types.js';
import type { Hazards } from './hazard.js';
import {
  BULK_MODES,
  DEFAULT_MODES,
  ELECTROLYTIC_THRESHOLD,
  OPTO_LED_FACTOR,
  PART_KINDS,
  TRANSFER_MODES,
  type FaultAction,
  type ModeTemplate,
  type PartKind,
} from './kinds.js';

export interface PartOverride {
  kind?: PartKind;
  /** Total prior per mode name (the sweep shares are kept). */
  priors?: Record<string, number>;
}

export interface ElectricalMode {
  name: string;
  action: FaultAction;
  prior: number;
  source: ModeTemplate['source'] | 'override';
  sweep: readonly number[];
  weights: readonly number[];
  /** Flat element the mode rewrites (lower-case); absent for whole-part modes (regulator). */
  target?: string;
}

export interface ElectricalPart {
  name: string;
  kind: PartKind;
  /** Lower-case flat names of the part's elements. */
  elements: string[];
  /** Top-level nets the part touches. */
  nets: string[];
  /** Regulator ports (nets) when recognised by port name. */
  ports?: { in?: string; out?: string; gnd?: string };
  modes: ElectricalMode[];
}

function findSubckt(netlist: Netlist, name: string | undefined): SubcktDef | undefined {
  if (!name) return undefined;
  return netlist.subckts[name.toLowerCase()] ?? Object.values(netlist.subckts).find((s) => s.name.toLowerCase() === name.toLowerCase());
}

export function inferKind(el: Element | undefined, raw: RawElement, netlist: Netlist): PartKind {
  switch (raw.letter) {
    case 'R':
      return 'resistor';
    case 'C':
      return el && el.kind === 'C' && el.value >= ELECTROLYTIC_THRESHOLD ? 'electrolytic-capacitor' : 'ceramic-capacitor';
    case 'L':
      return 'inductor';
    case 'D':
      return 'diode';
    case 'Q':
      return 'bjt';
    case 'X': {
      const sub = findSubckt(netlist, raw.model);
      // An opto-coupler: an LED and an output isolated from it — a current transfer (F/G), or a transistor that
      // shares no node with the diode. A zener-referenced regulator (diode on the transistor's base) is not one.
      const els = sub?.elements ?? [];
      const diodes = els.filter((e) => e.letter === 'D');
      if (diodes.length > 0 && els.some((e) => e.letter === 'F' || e.letter === 'G')) return 'opto-coupler';
      const dNodes = new Set(diodes.flatMap((e) => e.nodes.map((n) => n.toLowerCase())));
      const isolated = els.some((e) => e.letter === 'Q' && e.nodes.every((n) => !dNodes.has(n.toLowerCase())));
      return diodes.length > 0 && isolated ? 'opto-coupler' : 'subcircuit';
    }
    default:
      return 'source';
  }
}

function templateFor(el: Element, kindHint?: PartKind): readonly ModeTemplate[] {
  switch (el.kind) {
    case 'R':
      return DEFAULT_MODES.resistor;
    case 'C':
      return DEFAULT_MODES[kindHint === 'electrolytic-capacitor' || el.value >= ELECTROLYTIC_THRESHOLD ? 'electrolytic-capacitor' : 'ceramic-capacitor'];
    case 'L':
      return DEFAULT_MODES.inductor;
    case 'D':
      return DEFAULT_MODES.diode;
    case 'Q':
      return DEFAULT_MODES.bjt;
    case 'F':
    case 'G':
    case 'E':
    case 'H':
      return TRANSFER_MODES;
    default:
      return [];
  }
}

function fromTemplate(t: ModeTemplate, name: string, target: string | undefined, factor = 1): ElectricalMode {
  const sweep = t.sweep ?? [NaN];
  const weights = t.weights ?? sweep.map(() => 1);
  return { name, action: t.action, prior: t.prior * factor, source: t.source, sweep, weights, target };
}

const PORT_PATTERNS = {
  in: /^(in|vin|vi|i|input)$/i,
  out: /^(out|vout|vo|o|output)$/i,
  gnd: /^(gnd|com|common|0|g|adj|ref)$/i,
};

/**
 * Build the parts of a board from its netlist and flat (healthy, powered) circuit. With `hazards`, the bulk
 * electrolytic capacitor(s) on the rectified bus get the behavioural BULK_MODES on the bus source. Elements named
 * in `offBoard` (the load a connector sees, the mains behind a plug) stay in the circuit but are not parts: a
 * technician cannot replace what is not on the board, so they are never candidates, lifted or named.
 */
export function buildParts(
  netlist: Netlist,
  circuit: Circuit,
  overrides: Record<string, PartOverride> = {},
  hazards?: Hazards,
  offBoard: readonly string[] = [],
): ElectricalPart[] {
  const skip = new Set(offBoard.map((n) => n.toLowerCase()));
  const byPart = new Map<string, Element[]>();
  for (const e of circuit.elements) {
    const k = e.part.toLowerCase();
    const list = byPart.get(k);
    if (list) list.push(e);
    else byPart.set(k, [e]);
  }
  const overrideByLower = new Map(Object.entries(overrides).map(([k, v]) => [k.toLowerCase(), v]));
  const parts: ElectricalPart[] = [];
  for (const raw of netlist.elements) {
    const lname = raw.name.toLowerCase();
    if (skip.has(lname)) continue;
    const els = byPart.get(lname) ?? [];
    const ov = overrideByLower.get(lname);
    const kind = ov?.kind ?? inferKind(els.length === 1 ? els[0] : undefined, raw, netlist);
    const nets = [...new Set(raw.nodes.map(normNode))];
    const part: ElectricalPart = { name: raw.name, kind, elements: els.map((e) => e.name.toLowerCase()), nets, modes: [] };
    if (kind === 'regulator') {
      part.modes = DEFAULT_MODES.regulator.map((t) => fromTemplate(t, t.name, undefined));
      const sub = findSubckt(netlist, raw.model);
      if (sub) {
        const ports: NonNullable<ElectricalPart['ports']> = {};
        sub.ports.forEach((p, i) => {
          const net = raw.nodes[i];
          if (net === undefined) return;
          for (const key of ['in', 'out', 'gnd'] as const) if (PORT_PATTERNS[key].test(p)) ports[key] = normNode(net);
        });
        part.ports = ports;
        part.modes = part.modes.filter((m) =>
          m.action === 'out-short'
            ? ports.out && ports.gnd
            : m.action === 'in-out-short'
              ? ports.in && ports.out
              : m.action === 'current-limit'
                ? ports.out
                : true,
        );
      } else {
        part.modes = part.modes.filter((m) => m.action === 'dead');
      }
    } else if (raw.letter === 'X' || kind === 'opto-coupler' || kind === 'subcircuit') {
      for (const e of els) {
        const internal = e.name.slice(e.name.indexOf('.') + 1);
        // Nested instances: the internal element name keeps its path ("xa.r1").
        const prefix = internal.toLowerCase();
        const factor = kind === 'opto-coupler' && e.kind === 'D' ? OPTO_LED_FACTOR : 1;
        const tpl = e.kind === 'D' && kind === 'opto-coupler' ? DEFAULT_MODES.led : templateFor(e);
        // An opto-coupler's modes are those of its LED, its transistor and its transfer source; helper
        // resistors and sense sources inside the model are not parts that fail.
        if (kind === 'opto-coupler' && !(e.kind === 'D' || e.kind === 'Q' || e.kind === 'F' || e.kind === 'G')) continue;
        for (const t of tpl) {
          if (e.kind === 'V' || e.kind === 'I') continue;
          part.modes.push(fromTemplate(t, `${prefix}:${t.name}`, e.name.toLowerCase(), factor));
        }
      }
    } else if (els.length === 1) {
      const e = els[0] as Element;
      const tpl = kind === 'source' ? [] : DEFAULT_MODES[kind].length > 0 ? DEFAULT_MODES[kind] : templateFor(e, kind);
      // A kind whose actions do not fit the element (bjt modes on a resistor) falls back to the element's own.
      const fits = tpl.filter((t) => actionFits(t.action, e));
      part.modes = fits.map((t) => fromTemplate(t, t.name, e.name.toLowerCase()));
      if (kind === 'electrolytic-capacitor' && hazards?.busSource && nets.some((n) => hazards.bus.has(n))) {
        for (const t of BULK_MODES) part.modes.push(fromTemplate(t, t.name, hazards.busSource));
      }
    }
    if (ov?.priors) {
      for (const [mode, p] of Object.entries(ov.priors)) {
        const m = part.modes.find((x) => x.name === mode);
        if (!m) throw new Error(`parts.${raw.name}: unknown mode ${mode} for ${kind} (modes: ${part.modes.map((x) => x.name).join(', ') || 'none'})`);
        if (!(typeof p === 'number' && p >= 0 && p < 1)) throw new Error(`parts.${raw.name}: prior of ${mode} must be a number in [0, 1)`);
        m.prior = p;
        m.source = 'override';
      }
    }
    parts.push(part);
  }
  for (const k of overrideByLower.keys()) {
    if (!parts.some((p) => p.name.toLowerCase() === k)) throw new Error(`parts: unknown part ${k.toUpperCase()}`);
  }
  for (const [k, v] of overrideByLower) {
    if (v.kind !== undefined && !PART_KINDS.includes(v.kind)) throw new Error(`parts.${k.toUpperCase()}: unknown kind ${String(v.kind)}`);
  }
  return parts;
}

function actionFits(a: FaultAction, e: Element): boolean {
  switch (a) {
    case 'ce-short':
    case 'be-short':
    case 'be-open':
    case 'bc-open':
      return e.kind === 'Q';
    case 'short':
    case 'open':
    case 'parallel':
      return e.nodes.length >= 2;
    case 'scale':
      return e.kind === 'R' || e.kind === 'C' || e.kind === 'L' || e.kind === 'E' || e.kind === 'F' || e.kind === 'G' || e.kind === 'H';
    default:
      return false;
  }
}

export function toComponents(parts: readonly ElectricalPart[]): Component[] {
  return parts
    .filter((p) => p.modes.length > 0)
    .map((p) => ({
      name: p.name,
      modes: p.modes.map((m) => {
        const wsum = m.weights.reduce((a, b) => a + b, 0);
        return { name: m.name, prior: m.prior, points: m.sweep.map((v, i) => ({ value: v, weight: (m.weights[i] ?? 1) / wsum })) };
      }),
    }));
}

const LEAK = 1e12;

function res(name: string, part: string, a: string, b: string, ohms: number): Element {
  return { kind: 'R', name, part, nodes: [a, b], value: ohms };
}

/**
 * Apply sub-faults to a circuit (already in its board state). Returns a new circuit sharing unchanged
 * element objects. Faults on parts absent from the circuit (lifted) change nothing.
 */
export function applyFaults(circuit: Circuit, faults: readonly SubFault[], partsByName: ReadonlyMap<string, ElectricalPart>): Circuit {
  if (faults.length === 0) return circuit;
  let elements: Element[] = circuit.elements.slice();
  const added: Element[] = [];
  const leakNodes = new Set<string>();
  for (const f of faults) {
    const part = partsByName.get(f.component);
    const mode = part?.modes.find((m) => m.name === f.mode);
    if (!part || !mode) throw new Error(`unknown fault ${f.component}:${f.mode}`);
    const v = f.value;
    const tag = `${part.name}#${mode.name}`;
    if (mode.action === 'dead') {
      const set = new Set(part.elements);
      for (const e of elements) if (set.has(e.name.toLowerCase())) for (const n of e.nodes) leakNodes.add(n);
      elements = elements.filter((e) => !set.has(e.name.toLowerCase()));
      continue;
    }
    if (mode.action === 'source-scale') {
      // Behavioural bulk-capacitor mode: the bus source (present only when powered) scaled. A lifted capacitor's
      // state already has the unsmoothed bus (model.ts), so its fault changes nothing more.
      const own = new Set(part.elements);
      if (!elements.some((e) => own.has(e.name.toLowerCase()))) continue;
      const si = elements.findIndex((e) => e.name.toLowerCase() === mode.target && e.kind === 'V');
      const src = elements[si];
      if (src && src.kind === 'V') elements[si] = { ...src, value: src.value * v };
      continue;
    }
    if (mode.action === 'current-limit') {
      // The regulator's output pin moved to an inner node, joined to the board's output net by `v` ohms.
      const out = part.ports?.out;
      const set = new Set(part.elements);
      if (!out || !elements.some((e) => set.has(e.name.toLowerCase()))) continue; // lifted
      const inner = `${part.name.toLowerCase()}#out`;
      elements = elements.map((e) =>
        set.has(e.name.toLowerCase()) && e.nodes.includes(out) ? ({ ...e, nodes: e.nodes.map((n) => (n === out ? inner : n)) } as Element) : e,
      );
      added.push(res(tag, part.name, inner, out, v));
      continue;
    }
    if (mode.action === 'out-short' || mode.action === 'in-out-short') {
      if (!elements.some((e) => e.part.toLowerCase() === part.name.toLowerCase())) continue; // lifted
      const p = part.ports ?? {};
      const a = mode.action === 'out-short' ? p.out : p.in;
      const b = mode.action === 'out-short' ? p.gnd : p.out;
      if (a && b) added.push(res(tag, part.name, a, b, v));
      continue;
    }
    const idx = elements.findIndex((e) => e.name.toLowerCase() === mode.target);
    if (idx < 0) continue; // lifted part
    const e = elements[idx] as Element;
    switch (mode.action) {
      case 'short':
      case 'open':
        elements.splice(idx, 1);
        added.push(res(tag, e.part, e.nodes[0] as string, e.nodes[1] as string, v));
        break;
      case 'parallel':
        added.push(res(tag, e.part, e.nodes[0] as string, e.nodes[1] as string, v));
        break;
      case 'scale': {
        if (e.kind === 'R' || e.kind === 'C' || e.kind === 'L') elements[idx] = { ...e, value: e.value * v };
        else if (e.kind === 'E' || e.kind === 'F' || e.kind === 'G' || e.kind === 'H') elements[idx] = { ...e, gain: e.gain * v };
        break;
      }
      case 'ce-short':
      case 'be-short': {
        const q = e as BjtElement;
        const [c, b, em] = q.nodes;
        added.push(res(tag, e.part, mode.action === 'ce-short' ? c : b, em, v));
        break;
      }
      case 'be-open':
      case 'bc-open': {
        // The transistor is left with its other junction alone: a diode with the junction's saturation
        // current (Ebers–Moll: an isolated junction conducts I_S (1 + 1/β) (e^{V/nV_T} - 1)).
        const q = e as BjtElement;
        const [c, b, em] = q.nodes;
        const m = q.model;
        const other = mode.action === 'be-open' ? c : em; // be-open keeps base–collector
        const beta = mode.action === 'be-open' ? m.br : m.bf;
        const n = mode.action === 'be-open' ? m.nr : m.nf;
        const [anode, cathode] = m.type === 'npn' ? [b, other] : [other, b];
        elements.splice(idx, 1);
        added.push({
          kind: 'D',
          name: tag,
          part: e.part,
          nodes: [anode, cathode],
          model: { is: m.is * q.area * (1 + 1 / Math.max(beta, 1e-3)), n, rs: 0, bv: Infinity, ibv: 1e-3 },
          area: 1,
        });
        for (const x of [c, b, em]) leakNodes.add(x);
        break;
      }
    }
  }
  for (const n of leakNodes) if (n !== '0') added.push(res(`leak#${n}`, 'leak', n, '0', LEAK));
  return { ...circuit, elements: elements.concat(added) };
}
