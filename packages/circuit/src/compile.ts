/**
 * Compiles a circuit's structure into a reusable MNA system. Everything that depends only on the structure (the
 * node and branch numbering, the fill-reducing order, the sparse LU program, the matrix position of every stamp)
 * is computed once per structure and cached (structure-cache.ts); a solve then only writes values into
 * preallocated arrays (stamp.ts) and runs Newton (newton.ts, stepping.ts). The
 * diagnosis engine solves the same board in a handful of states and fault variants many times, and a first reading
 * on a board compiles once for all the probes that follow.
 */
import type { Element } from './circuit';
import { REFERENCE } from './circuit';
import { luProgram, minimumDegreeOrder } from './lu';
import { allocateWork, type Topology } from './system';
import { islands } from './topology';

/** Slot kinds recorded before the numbering is final. */
const MAT = 0;
const ROW = 1;

export function compileTopology(elements: readonly Element[], extraNodes: readonly string[], structure: Int32Array): Topology {
  const nodeIndex = new Map<string, number>();
  const nodeNames: string[] = [];
  const addNode = (name: string): number => {
    if (name === REFERENCE) return -1;
    let i = nodeIndex.get(name);
    if (i === undefined) {
      i = nodeNames.length;
      nodeIndex.set(name, i);
      nodeNames.push(name);
    }
    return i;
  };
  for (const e of elements) for (const nd of e.nodes) addNode(nd);
  for (const nd of extraNodes) addNode(nd);
  const outerNodes = nodeNames.length;
  const internal: number[][] = elements.map((e) => {
    const low = e.name.toLowerCase();
    if (e.kind === 'D') return [e.model.rs > 0 ? addNode(`${low}#int`) : -2];
    if (e.kind !== 'Q') return [];
    const m = e.model;
    return [m.rc > 0 ? addNode(`${low}#c`) : -2, m.rb > 0 ? addNode(`${low}#b`) : -2, m.re > 0 ? addNode(`${low}#e`) : -2];
  });
  const nodeCount = nodeNames.length;
  const branchNames: string[] = [];
  const branchLogical = new Map<string, number>();
  for (const e of elements) {
    if (e.kind === 'V' || e.kind === 'L' || e.kind === 'E' || e.kind === 'H') {
      branchLogical.set(e.name.toLowerCase(), nodeCount + branchNames.length);
      branchNames.push(e.name.toLowerCase());
    }
  }
  const n = nodeCount + branchNames.length;
  const node = (name: string) => nodeIndex.get(name) ?? -1;

  // Slots in logical numbering (equation = unknown index: KCL of node i, equation of branch k).
  const code: number[] = [];
  const sa: number[] = [];
  const sb: number[] = [];
  const mat = (eq: number, unk: number) => {
    code.push(MAT);
    sa.push(eq);
    sb.push(unk);
  };
  const row = (eq: number) => {
    code.push(ROW);
    sa.push(eq);
    sb.push(-1);
  };
  const cond = (p: number, q: number) => {
    mat(p, p);
    mat(q, q);
    mat(p, q);
    mat(q, p);
  };
  const branch = (k: number, p: number, q: number) => {
    mat(p, k);
    mat(q, k);
    mat(k, p);
    mat(k, q);
  };
  // Twin rows (SPICE's pre-ordering of voltage-source branches): the branch equation of a V/L/E/H element takes the
  // row of one of its nodes and that node's KCL takes the branch row, so both diagonals are the exact ±1 of the
  // branch stamp instead of a structural zero that only fill-in can make non-zero.
  const eqRow = Int32Array.from({ length: n }, (_, i) => i);
  const twinned = new Uint8Array(n);
  const after: (number[] | undefined)[] = new Array<number[] | undefined>(n);
  const slotStart = new Int32Array(elements.length + 1);
  const dEl: number[] = [];
  const bjEl: number[] = [];
  const dSlots: number[] = [];
  const qSlots: number[] = [];
  const xOf = new Int32Array(4 * elements.length).fill(-1);
  elements.forEach((e, ei) => {
    slotStart[ei] = code.length;
    for (let t = 0; t < e.nodes.length; t++) xOf[4 * ei + t] = node(e.nodes[t] as string);
    const p = node(e.nodes[0]);
    const q = node(e.nodes[1]);
    switch (e.kind) {
      case 'R':
        cond(p, q);
        break;
      case 'C':
        break;
      case 'I':
        row(p);
        row(q);
        break;
      case 'G': {
        const cp = node(e.nodes[2]);
        const cq = node(e.nodes[3]);
        mat(p, cp);
        mat(p, cq);
        mat(q, cp);
        mat(q, cq);
        break;
      }
      case 'F': {
        const kc = branchLogical.get(e.control.toLowerCase());
        if (kc === undefined) throw new Error(`${e.name}: controlling voltage source "${e.control}" is not in the circuit`);
        mat(p, kc);
        mat(q, kc);
        break;
      }
      case 'V':
      case 'L':
      case 'E':
      case 'H': {
        const k = branchLogical.get(e.name.toLowerCase()) as number;
        const twin = p >= 0 && !twinned[p] ? p : q >= 0 && !twinned[q] ? q : -1;
        if (twin >= 0) {
          twinned[twin] = 1;
          eqRow[k] = twin;
          eqRow[twin] = k;
        } else after[k] = [p, q].filter((i) => i >= 0);
        branch(k, p, q);
        if (e.kind === 'V') row(k);
        if (e.kind === 'E') {
          mat(k, node(e.nodes[2]));
          mat(k, node(e.nodes[3]));
        }
        if (e.kind === 'H') {
          const kc = branchLogical.get(e.control.toLowerCase());
          if (kc === undefined) throw new Error(`${e.name}: controlling voltage source "${e.control}" is not in the circuit`);
          mat(k, kc);
        }
        break;
      }
      case 'D': {
        const ai = (internal[ei] as number[])[0] as number;
        const a = ai === -2 ? p : ai;
        if (ai === -2) cond(-1, -1);
        else cond(p, ai);
        dEl.push(ei);
        dSlots.push(code.length);
        cond(a, q);
        row(a);
        row(q);
        break;
      }
      case 'Q': {
        const ins = internal[ei] as number[];
        const t = [p, q, node(e.nodes[2])].map((x, i) => {
          const ii = ins[i] as number;
          if (ii === -2) cond(-1, -1);
          else cond(x, ii);
          return ii === -2 ? x : ii;
        });
        const [c, b, em] = t as [number, number, number];
        bjEl.push(ei);
        qSlots.push(code.length);
        for (const r of [c, b, em]) for (const col of [b, em, c]) mat(r, col);
        row(c);
        row(b);
        row(em);
        // GMIN across the substrate junction (ngspice bjtload.c), from the collector (vertical) or the base (lateral)
        cond(e.model.subs === -1 ? b : c, node(e.substrate ?? REFERENCE));
        break;
      }
    }
  });
  slotStart[elements.length] = code.length;
  // every node's own diagonal (islands, gmin stepping)
  const shuntSlot = code.length;
  for (let i = 0; i < nodeCount; i++) mat(i, i);

  // fill-reducing order on the row-permuted structure
  const adj: Set<number>[] = Array.from({ length: n }, () => new Set<number>());
  for (let t = 0; t < code.length; t++) {
    if (code[t] !== MAT) continue;
    const eq = sa[t] as number;
    const unk = sb[t] as number;
    if (eq < 0 || unk < 0) continue;
    const r = eqRow[eq] as number;
    if (r !== unk) {
      (adj[r] as Set<number>).add(unk);
      (adj[unk] as Set<number>).add(r);
    }
  }
  // An untwinned branch waits for one of its nodes (its diagonal is non-zero only by fill-in); twins need not.
  const order = minimumDegreeOrder(n, adj, after);
  const inv = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) inv[order[k] as number] = k;
  inv[n] = n;
  const rowPos = (eq: number) => (eq < 0 ? n : (inv[eqRow[eq] as number] as number));
  const colPos = (unk: number) => (unk < 0 ? n : (inv[unk] as number));
  const nz = new Uint8Array(n * n);
  for (let t = 0; t < code.length; t++) {
    if (code[t] !== MAT) continue;
    const r = rowPos(sa[t] as number);
    const c = colPos(sb[t] as number);
    if (r < n && c < n) nz[r * n + c] = 1;
  }
  const { program, posOf } = luProgram(n, nz);
  const trash = program.nnz;
  const slots = new Int32Array(code.length);
  for (let t = 0; t < code.length; t++) {
    const r = rowPos(sa[t] as number);
    if (code[t] === ROW) slots[t] = r;
    else {
      const c = colPos(sb[t] as number);
      slots[t] = r < n && c < n ? (posOf[r * n + c] as number) : trash;
    }
  }
  for (let t = 0; t < xOf.length; t++) xOf[t] = colPos(xOf[t] as number);

  const dPos = new Int32Array(4 * dEl.length);
  const dRow = new Int32Array(2 * dEl.length);
  const dX = new Int32Array(2 * dEl.length);
  dSlots.forEach((s0, i) => {
    dPos.set(slots.subarray(s0, s0 + 4), 4 * i);
    dRow.set(slots.subarray(s0 + 4, s0 + 6), 2 * i);
    dX[2 * i] = colPos(sa[s0] as number); // cond(a, k): slot 0 is (a, a)
    dX[2 * i + 1] = colPos(sa[s0 + 1] as number);
  });
  const qPos = new Int32Array(9 * bjEl.length);
  const qRow = new Int32Array(3 * bjEl.length);
  const qX = new Int32Array(3 * bjEl.length);
  qSlots.forEach((s0, i) => {
    qPos.set(slots.subarray(s0, s0 + 9), 9 * i);
    qRow.set(slots.subarray(s0 + 9, s0 + 12), 3 * i);
    // slot layout: rows c, b, e × columns b, e, c; slot 2 is (c, c), slot 3 is (b, b), slot 4 is (b, e)
    qX[3 * i] = colPos(sb[s0 + 2] as number);
    qX[3 * i + 1] = colPos(sb[s0 + 3] as number);
    qX[3 * i + 2] = colPos(sb[s0 + 4] as number);
  });
  const shuntPos = slots.slice(shuntSlot, shuntSlot + nodeCount);
  const shuntRow = Int32Array.from({ length: nodeCount }, (_, i) => rowPos(i));
  const shuntX = Int32Array.from({ length: nodeCount }, (_, i) => colPos(i));
  const islandPos = Int32Array.from(islands(elements, node, outerNodes, nodeCount), (i) => shuntPos[i] as number);

  const solutionIndex = new Map<string, number>();
  for (const [k, v] of nodeIndex) solutionIndex.set(k, inv[v] as number);
  const branchOf = new Map<string, number>();
  for (const [k, v] of branchLogical) branchOf.set(k, inv[v] as number);
  const isNode = new Uint8Array(n);
  const describe = new Array<string>(n);
  for (let i = 0; i < nodeCount; i++) {
    isNode[inv[i] as number] = 1;
    describe[inv[i] as number] = `node ${nodeNames[i]}`;
  }
  for (let i = 0; i < branchNames.length; i++) describe[inv[nodeCount + i] as number] = `the branch of ${branchNames[i]}`;
  const nd = dEl.length;
  const nq = bjEl.length;
  return {
    codes: structure,
    n,
    nodeCount,
    nodeNames,
    branchNames,
    nodeX: Int32Array.from(nodeNames, (_, i) => inv[i] as number),
    branchX: Int32Array.from(branchNames, (_, i) => inv[nodeCount + i] as number),
    nodeIndex: solutionIndex,
    branchOf,
    isNode,
    describe,
    lu: program,
    slotStart,
    slots,
    xOf,
    islandPos,
    shuntPos,
    shuntRow,
    shuntX,
    dEl: Int32Array.from(dEl),
    dPos,
    dRow,
    dX,
    qEl: Int32Array.from(bjEl),
    qPos,
    qRow,
    qX,
    work: allocateWork(n, trash + 1, nd, nq),
  };
}
