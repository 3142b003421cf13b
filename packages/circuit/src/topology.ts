import type { Element } from './circuit';
import { REFERENCE } from './circuit';

/** The DC-path rule: R, L, V, D and the output branch of E and H join their two nodes, Q its three; C, I, F, G none. */
function joinDcPaths(e: Element, union: (a: string, b: string) => void): void {
  switch (e.kind) {
    case 'R':
    case 'L':
    case 'V':
    case 'D':
    case 'H':
    case 'E':
      union(e.nodes[0], e.nodes[1]);
      break;
    case 'Q':
      union(e.nodes[0], e.nodes[1]);
      union(e.nodes[1], e.nodes[2]);
      break;
    default:
      break;
  }
}

/**
 * Nodes with no DC path to the reference. DC paths are R, L, V, D, Q (all terminals) and the output branch of
 * E/H sources; capacitors are open and ideal current sources (I, F, G) have no DC conductance.
 */
export function nodesWithoutDcPath(elements: readonly Element[], extraNodes: readonly string[] = []): string[] {
  const parent = new Map<string, string>();
  const find = (x: string): string => {
    let r = x;
    for (;;) {
      const p = parent.get(r);
      if (p === undefined) {
        parent.set(r, r);
        break;
      }
      if (p === r) break;
      r = p;
    }
    // path compression
    let y = x;
    while (y !== r) {
      const p = parent.get(y) as string;
      parent.set(y, r);
      y = p;
    }
    return r;
  };
  const union = (a: string, b: string) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent.set(ra, rb);
  };
  find(REFERENCE);
  for (const n of extraNodes) find(n);
  for (const e of elements) {
    for (const n of e.nodes) find(n);
    joinDcPaths(e, union);
  }
  const ground = find(REFERENCE);
  const out: string[] = [];
  for (const n of parent.keys()) if (n !== REFERENCE && find(n) !== ground) out.push(n);
  return out;
}

/**
 * Nodes (of the elements and extra nodes, numbered below `outer`) with no DC path to the reference: the rule of
 * `nodesWithoutDcPath` on the node numbers instead of the names, since it runs for every structure compiled.
 */
export function islands(elements: readonly Element[], node: (name: string) => number, outer: number, nodeCount: number): number[] {
  // index nodeCount stands for the reference
  const parent = Int32Array.from({ length: nodeCount + 1 }, (_, i) => i);
  const find = (x: number): number => {
    let r = x;
    while (parent[r] !== r) r = parent[r] as number;
    while (parent[x] !== r) {
      const p = parent[x] as number;
      parent[x] = r;
      x = p;
    }
    return r;
  };
  const at = (name: string) => {
    const i = node(name);
    return i < 0 ? nodeCount : i;
  };
  const union = (a: string, b: string) => {
    const ra = find(at(a));
    const rb = find(at(b));
    if (ra !== rb) parent[ra] = rb;
  };
  for (const e of elements) joinDcPaths(e, union);
  const ground = find(nodeCount);
  const out: number[] = [];
  for (let i = 0; i < outer; i++) if (find(i) !== ground) out.push(i);
  return out;
}
