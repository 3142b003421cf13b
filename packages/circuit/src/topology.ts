import type { Element } from './circuit';
import { REFERENCE } from './circuit';

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
    switch (e.kind) {
      case 'R':
      case 'L':
      case 'V':
      case 'D':
      case 'F':
      case 'H':
        if (e.kind === 'F') break;
        union(e.nodes[0], e.nodes[1]);
        break;
      case 'Q':
        union(e.nodes[0], e.nodes[1]);
        union(e.nodes[1], e.nodes[2]);
        break;
      case 'E':
        union(e.nodes[0], e.nodes[1]);
        break;
      default:
        break;
    }
  }
  const ground = find(REFERENCE);
  const out: string[] = [];
  for (const n of parent.keys()) if (n !== REFERENCE && find(n) !== ground) out.push(n);
  return out;
}
