/**
 * Fault rubber stamps (fault-sim.ts): a fault on a linear part read as conductance changes between nets the
 * healthy board already has, and the node voltages a fast fault solve gives.
 */
import type { Circuit, Element } from './circuit';

/** A conductance change of `dg` siemens between two nets (lower-case names, "0" the reference). */
export interface RubberStamp {
  a: string;
  b: string;
  dg: number;
}

export type FaultMethod = 'woodbury' | 'newton-woodbury' | 'full';

export interface FaultSolution {
  /** Node voltage by lower-case name (0 for the reference or an unknown net). */
  voltage(node: string): number;
  /** Every node voltage by name. */
  nodes(): Record<string, number>;
  method: FaultMethod;
  /** Newton steps (2 for a linear board: the solve and one refinement). */
  iterations: number;
}

/**
 * The conductance stamps that turn `healthy` into `faulted`, or undefined when the difference is not one (an
 * element other than a resistor or capacitor added, removed or changed, or a net only one of them has). A
 * capacitor is open at DC, so adding or removing one stamps nothing.
 */
export function rubberStamps(healthy: Circuit, faulted: Circuit): RubberStamp[] | undefined {
  const before = new Map(healthy.elements.map((e) => [e.name, e]));
  const after = new Map(faulted.elements.map((e) => [e.name, e]));
  // elements are matched by name: a name written twice cannot be matched
  if (before.size !== healthy.elements.length || after.size !== faulted.elements.length) return undefined;
  const out: RubberStamp[] = [];
  const stamp = (e: Element, sign: number): boolean => {
    if (e.kind === 'C') return true;
    if (e.kind !== 'R') return false;
    out.push({ a: e.nodes[0] as string, b: e.nodes[1] as string, dg: sign / e.value });
    return true;
  };
  for (const [name, e] of before) {
    const f = after.get(name);
    if (f === e) continue;
    if (!f) {
      if (!stamp(e, -1)) return undefined;
    } else if (!sameElement(e, f)) {
      if (!stamp(e, -1) || !stamp(f, 1)) return undefined;
    }
  }
  for (const [name, f] of after) if (!before.has(name) && !stamp(f, 1)) return undefined;
  return sameNets(healthy, faulted) ? out.filter((s) => s.dg !== 0 && s.a !== s.b) : undefined;
}

function sameElement(a: Element, b: Element): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

function netsOf(c: Circuit): Set<string> {
  const s = new Set<string>();
  for (const e of c.elements) for (const n of e.nodes) s.add(n);
  return s;
}

function sameNets(a: Circuit, b: Circuit): boolean {
  const na = netsOf(a);
  const nb = netsOf(b);
  return na.size === nb.size && [...na].every((n) => nb.has(n));
}

export class Solution implements FaultSolution {
  constructor(
    private readonly x: Float64Array,
    private readonly nodeIndex: ReadonlyMap<string, number>,
    readonly method: FaultMethod,
    readonly iterations: number,
  ) {}

  voltage(node: string): number {
    const i = this.nodeIndex.get(node);
    return i === undefined ? 0 : (this.x[i] as number);
  }

  nodes(): Record<string, number> {
    const out: Record<string, number> = {};
    for (const [name, i] of this.nodeIndex) out[name] = this.x[i] as number;
    return out;
  }
}
