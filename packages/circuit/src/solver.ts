import type { Circuit, Element } from './circuit';
import { REFERENCE } from './circuit';
import { luFactor, luSolve, luSparseFactor, luSparseSolve, luWorkspace, minimumDegreeOrder, sparsePattern, type LuWorkspace, type SparsePattern } from './lu';
import { nodesWithoutDcPath } from './topology';

/** Thermal voltage kT/q at 27 °C (300.15 K) with the constants ngspice uses (CONSTboltz, CHARGE). */
export const VT = (1.38064852e-23 * 300.15) / 1.6021766208e-19;
/** Conductance SPICE puts across every pn junction (ngspice default GMIN). */
export const GMIN = 1e-12;
/** Conductance from nodes with no DC path to the reference (islands of a derived board state). */
export const GISLAND = 1e-12;

export interface SolveOptions {
  /** Warm start: a previous OpResult.x of the same topology, or node voltages by name. */
  initialGuess?: Float64Array | Record<string, number>;
  /** Newton iterations per attempt (default 150). */
  maxIterations?: number;
  /** Relative tolerance on the solution (default 1e-6, tighter than SPICE's RELTOL 1e-3). */
  reltol?: number;
  /** Absolute voltage tolerance, V (default 1e-9). */
  vntol?: number;
  /** Absolute current tolerance, A (default 1e-14). */
  abstol?: number;
  /** Nodes that must exist even if no element touches them (e.g. probe nets). */
  extraNodes?: readonly string[];
}

export type SolveMethod = 'linear' | 'newton' | 'damped' | 'gmin' | 'source';

export interface OpResult {
  converged: boolean;
  /** Node voltages by lower-case name, internal nodes included, reference excluded. */
  nodes: Record<string, number>;
  /** Branch currents of V, L, E and H elements by lower-case flat name (SPICE sign: into the + terminal). */
  sources: Record<string, number>;
  /**
   * Per-element current by flat name as written: R, L, V, E, H from nodes[0] through the element to nodes[1];
   * C 0; I, F, G their source current; D anode → cathode; Q collector current, with "<name>:b" (base) and
   * "<name>:e" (emitter) currents into the terminals.
   */
  currents: Record<string, number>;
  iterations: number;
  message?: string;
  /** How the solution was found. */
  method?: SolveMethod;
  /** The solution vector (node voltages then branch currents); pass as `initialGuess` for a warm start. */
  x?: Float64Array;
}

interface DiodeDev {
  name: string;
  a: number;
  k: number;
  is: number;
  vte: number;
  vcrit: number;
  /** Breakdown voltage adjusted to give IBV at BV (ngspice diotemp), Infinity when BV not given. */
  xbv: number;
  vold: number;
  /** Companion model of the last evaluation. */
  gd: number;
  ieq: number;
}

interface BjtDev {
  name: string;
  c: number;
  b: number;
  e: number;
  pol: number;
  is: number;
  bf: number;
  br: number;
  vtf: number;
  vtr: number;
  vcrit: number;
  vbe: number;
  vbc: number;
  /** Companion model of the last evaluation (conductances in model polarity, equivalent sources signed). */
  g11: number;
  g12: number;
  g21: number;
  g22: number;
  ceq: number;
  beq: number;
}

/** Compiled MNA system of one circuit. */
interface System {
  n: number;
  /** Row stride = n + 1: row/column n is a sink for the reference node, so stamps need no branches. */
  s: number;
  nodeNames: string[];
  nodeCount: number;
  branchNames: string[];
  a0: Float64Array;
  bsrc: Float64Array;
  diodes: DiodeDev[];
  bjts: BjtDev[];
  nodeIndex: Map<string, number>;
  branchOf: Map<string, number>;
  elements: readonly Element[];
  /** Fill-reducing elimination order: order[k] = unknown (compile numbering) eliminated k-th. */
  order: Int32Array;
  /** isNode[i]: unknown i (solver numbering) is a node voltage, not a branch current. */
  isNode: Uint8Array;
  pattern: SparsePattern;
}

function breakdownVoltage(bv: number, ibv: number, is: number, vt: number): number {
  if (!Number.isFinite(bv)) return Infinity;
  // ngspice diotemp.c: adjust BV so that the current at -BV equals IBV.
  const cbv = ibv;
  if (cbv < (is * bv) / vt) return bv;
  const tol = 1e-3 * cbv;
  let xbv = bv - vt * Math.log(1 + cbv / is);
  for (let i = 0; i < 25; i++) {
    xbv = bv - vt * Math.log(cbv / is + 1 - xbv / vt);
    const xcbv = is * (Math.exp((bv - xbv) / vt) - 1 + xbv / vt);
    if (Math.abs(xcbv - cbv) <= tol) break;
  }
  return xbv;
}

/**
 * Reusable matrix buffers by size: solving is synchronous and a System never outlives its solveOp call, so the
 * n² arrays are recycled instead of allocated (and collected) on every solve.
 */
const bufferPool = new Map<number, { a0: Float64Array; st: Uint8Array; pa0: Float64Array; a: Float64Array }>();

function buffers(s: number): { a0: Float64Array; st: Uint8Array; pa0: Float64Array; a: Float64Array } {
  let b = bufferPool.get(s);
  if (!b) {
    if (bufferPool.size > 16) bufferPool.clear();
    b = { a0: new Float64Array(s * s), st: new Uint8Array(s * s), pa0: new Float64Array(s * s), a: new Float64Array(s * s) };
    bufferPool.set(s, b);
  }
  return b;
}

function markClique(st: Uint8Array, s: number, n: number, t: number[]): void {
  for (const x of t) for (const y of t) if (x < n && y < n) st[x * s + y] = 1;
}

interface Symbolic {
  order: Int32Array;
  pattern: SparsePattern;
}

/**
 * Ordering and fill-in pattern depend only on the structure, so they are cached: the diagnosis engine solves the
 * same topology many times with different values.
 */
const symbolicCache = new Map<string, Symbolic>();

/** `key` identifies the structure: element kinds and the unknowns each touches, in order. */
function symbolic(key: string, st: Uint8Array, s: number, n: number, after: (number[] | undefined)[]): Symbolic {
  const hit = symbolicCache.get(key);
  if (hit) {
    symbolicCache.delete(key);
    symbolicCache.set(key, hit);
    return hit;
  }
  const adj: Set<number>[] = Array.from({ length: n }, () => new Set<number>());
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i !== j && (st[i * s + j] || st[j * s + i])) {
        (adj[i] as Set<number>).add(j);
        (adj[j] as Set<number>).add(i);
      }
    }
  }
  const order = minimumDegreeOrder(n, adj, after);
  const inv = new Int32Array(n);
  for (let k = 0; k < n; k++) inv[order[k] as number] = k;
  const nz = new Uint8Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (st[i * s + j]) nz[(inv[i] as number) * n + (inv[j] as number)] = 1;
  const sym = { order, pattern: sparsePattern(n, n + 1, nz) };
  symbolicCache.set(key, sym);
  if (symbolicCache.size > 200) symbolicCache.delete(symbolicCache.keys().next().value as string);
  return sym;
}

function compile(circuit: Circuit, extraNodes: readonly string[]): System {
  const elements = circuit.elements;
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
  // internal nodes
  const internal = new Map<Element, number[]>();
  for (const e of elements) {
    const low = e.name.toLowerCase();
    if (e.kind === 'D' && e.model.rs > 0) internal.set(e, [addNode(`${low}#int`)]);
    if (e.kind === 'Q') {
      const m = e.model;
      internal.set(e, [m.rc > 0 ? addNode(`${low}#c`) : -2, m.rb > 0 ? addNode(`${low}#b`) : -2, m.re > 0 ? addNode(`${low}#e`) : -2]);
    }
  }
  const nodeCount = nodeNames.length;
  const branchNames: string[] = [];
  const branchOf = new Map<string, number>();
  for (const e of elements) {
    if (e.kind === 'V' || e.kind === 'L' || e.kind === 'E' || e.kind === 'H') {
      branchOf.set(e.name.toLowerCase(), nodeCount + branchNames.length);
      branchNames.push(e.name.toLowerCase());
    }
  }
  const n = nodeCount + branchNames.length;
  const s = n + 1;
  const buf = buffers(s);
  buf.a0.fill(0);
  buf.st.fill(0);
  buf.pa0.fill(0);
  const a0 = buf.a0;
  const bsrc = new Float64Array(s);
  /** Structural non-zeros (from the topology, independent of values). */
  const st = buf.st;
  const G = (i: number) => (i < 0 ? n : i);
  const idx = (name: string) => G(nodeIndex.get(name) ?? -1);
  const cond = (p: number, q: number, g: number) => {
    a0[p * s + p] = (a0[p * s + p] as number) + (g);
    st[p * s + p] = 1;
    a0[q * s + q] = (a0[q * s + q] as number) + (g);
    st[q * s + q] = 1;
    a0[p * s + q] = (a0[p * s + q] as number) - (g);
    st[p * s + q] = 1;
    a0[q * s + p] = (a0[q * s + p] as number) - (g);
    st[q * s + p] = 1;
  };
  const branchStamp = (k: number, p: number, q: number) => {
    a0[p * s + k] = (a0[p * s + k] as number) + (1);
    st[p * s + k] = 1;
    a0[q * s + k] = (a0[q * s + k] as number) - (1);
    st[q * s + k] = 1;
    a0[k * s + p] = (a0[k * s + p] as number) + (1);
    st[k * s + p] = 1;
    a0[k * s + q] = (a0[k * s + q] as number) - (1);
    st[k * s + q] = 1;
  };
  const diodes: DiodeDev[] = [];
  const bjts: BjtDev[] = [];
  const after: (number[] | undefined)[] = new Array<number[] | undefined>(n);
  const terminals = (e: Element) => {
    const k = branchOf.get(e.name.toLowerCase()) as number;
    after[k] = [idx(e.nodes[0]), idx(e.nodes[1])].filter((i) => i !== n);
  };
  for (const e of elements) {
    if (e.kind === 'V' || e.kind === 'L' || e.kind === 'E' || e.kind === 'H') terminals(e);
    switch (e.kind) {
      case 'R':
        cond(idx(e.nodes[0]), idx(e.nodes[1]), 1 / e.value);
        break;
      case 'C':
        break;
      case 'V':
      case 'L': {
        const k = branchOf.get(e.name.toLowerCase()) as number;
        branchStamp(k, idx(e.nodes[0]), idx(e.nodes[1]));
        if (e.kind === 'V') bsrc[k] = (bsrc[k] as number) + e.value;
        break;
      }
      case 'I': {
        bsrc[idx(e.nodes[0])] = (bsrc[idx(e.nodes[0])] as number) - (e.value);
        bsrc[idx(e.nodes[1])] = (bsrc[idx(e.nodes[1])] as number) + (e.value);
        break;
      }
      case 'E': {
        const k = branchOf.get(e.name.toLowerCase()) as number;
        branchStamp(k, idx(e.nodes[0]), idx(e.nodes[1]));
        const cp = k * s + idx(e.nodes[2]);
        const cq = k * s + idx(e.nodes[3]);
        a0[cp] = (a0[cp] as number) - e.gain;
        a0[cq] = (a0[cq] as number) + e.gain;
        st[cp] = 1;
        st[cq] = 1;
        break;
      }
      case 'G': {
        const p = idx(e.nodes[0]);
        const q = idx(e.nodes[1]);
        const cp = idx(e.nodes[2]);
        const cq = idx(e.nodes[3]);
        a0[p * s + cp] = (a0[p * s + cp] as number) + (e.gain);
        st[p * s + cp] = 1;
        a0[p * s + cq] = (a0[p * s + cq] as number) - (e.gain);
        st[p * s + cq] = 1;
        a0[q * s + cp] = (a0[q * s + cp] as number) - (e.gain);
        st[q * s + cp] = 1;
        a0[q * s + cq] = (a0[q * s + cq] as number) + (e.gain);
        st[q * s + cq] = 1;
        break;
      }
      case 'F':
      case 'H': {
        const kc = branchOf.get(e.control.toLowerCase());
        if (kc === undefined) throw new Error(`${e.name}: controlling voltage source "${e.control}" is not in the circuit`);
        const p = idx(e.nodes[0]);
        const q = idx(e.nodes[1]);
        if (e.kind === 'F') {
          a0[p * s + kc] = (a0[p * s + kc] as number) + (e.gain);
          st[p * s + kc] = 1;
          a0[q * s + kc] = (a0[q * s + kc] as number) - (e.gain);
          st[q * s + kc] = 1;
        } else {
          const k = branchOf.get(e.name.toLowerCase()) as number;
          branchStamp(k, p, q);
          a0[k * s + kc] = (a0[k * s + kc] as number) - (e.gain);
          st[k * s + kc] = 1;
        }
        break;
      }
      case 'D': {
        const m = e.model;
        const is = m.is * e.area;
        const vte = m.n * VT;
        let a = idx(e.nodes[0]);
        if (m.rs > 0) {
          const ai = G((internal.get(e) as number[])[0] as number);
          cond(a, ai, e.area / m.rs);
          a = ai;
        }
        diodes.push({
          name: e.name,
          a,
          k: idx(e.nodes[1]),
          is,
          vte,
          vcrit: vte * Math.log(vte / (Math.SQRT2 * is)),
          xbv: breakdownVoltage(m.bv, m.ibv, is, vte),
          vold: 0,
          gd: 0,
          ieq: 0,
        });
        break;
      }
      case 'Q': {
        const m = e.model;
        const ins = internal.get(e) as number[];
        const ext = [idx(e.nodes[0]), idx(e.nodes[1]), idx(e.nodes[2])];
        const rr = [m.rc, m.rb, m.re];
        const t = ext.map((x, i) => {
          const ii = ins[i] as number;
          if (ii === -2) return x;
          const gi = G(ii);
          cond(x, gi, e.area / (rr[i] as number));
          return gi;
        });
        const is = m.is * e.area;
        bjts.push({
          name: e.name,
          c: t[0] as number,
          b: t[1] as number,
          e: t[2] as number,
          pol: m.type === 'pnp' ? -1 : 1,
          is,
          bf: m.bf,
          br: m.br,
          vtf: m.nf * VT,
          vtr: m.nr * VT,
          vcrit: VT * Math.log(VT / (Math.SQRT2 * is)),
          vbe: 0,
          vbc: 0,
          g11: 0,
          g12: 0,
          g21: 0,
          g22: 0,
          ceq: 0,
          beq: 0,
        });
        break;
      }
    }
  }
  // islands of a derived state: a tiny conductance to the reference keeps the matrix regular
  for (const nd of nodesWithoutDcPath(elements, extraNodes)) {
    const i = nodeIndex.get(nd);
    if (i !== undefined) a0[i * s + i] = (a0[i * s + i] as number) + GISLAND;
  }
  // internal nodes are always tied by their series resistors, so no island check is needed for them
  for (const d of diodes) markClique(st, s, n, [d.a, d.k]);
  for (const q of bjts) markClique(st, s, n, [q.c, q.b, q.e]);
  const keyParts: string[] = [String(n)];
  for (const e of elements) {
    let k = e.kind;
    for (const nd of e.nodes) k += `,${nodeIndex.get(nd) ?? -1}`;
    if (e.kind === 'F' || e.kind === 'H') k += `>${branchOf.get(e.control.toLowerCase()) ?? -1}`;
    const ins = internal.get(e);
    if (ins) k += `#${ins.join(',')}`;
    keyParts.push(k);
  }
  const sym = symbolic(keyParts.join(';'), st, s, n, after);
  const order = sym.order;
  // renumber every unknown into elimination order (the reference sink n stays n)
  const inv = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) inv[order[k] as number] = k;
  inv[n] = n;
  const pa0 = buf.pa0;
  const pbsrc = new Float64Array(s);
  for (let i = 0; i < s; i++) {
    const ni = (inv[i] as number) * s;
    for (let j = 0; j < s; j++) {
      const v = a0[i * s + j] as number;
      if (v !== 0) pa0[ni + (inv[j] as number)] = v;
    }
    pbsrc[inv[i] as number] = bsrc[i] as number;
  }
  for (const d of diodes) {
    d.a = inv[d.a] as number;
    d.k = inv[d.k] as number;
  }
  for (const q of bjts) {
    q.c = inv[q.c] as number;
    q.b = inv[q.b] as number;
    q.e = inv[q.e] as number;
  }
  for (const [k, v] of nodeIndex) nodeIndex.set(k, inv[v] as number);
  for (const [k, v] of branchOf) branchOf.set(k, inv[v] as number);
  const isNode = new Uint8Array(n);
  for (let i = 0; i < nodeCount; i++) isNode[inv[i] as number] = 1;
  const pattern = sym.pattern;
  return {
    n,
    s,
    nodeNames,
    nodeCount,
    branchNames,
    a0: pa0,
    bsrc: pbsrc,
    diodes,
    bjts,
    nodeIndex,
    branchOf,
    elements,
    order,
    isNode,
    pattern,
  };
}

/** SPICE junction voltage limiting (ngspice DEVpnjlim). Returns the limited voltage; sets lim.hit. */
function pnjlim(vnew: number, vold: number, vt: number, vcrit: number, lim: { hit: boolean }): number {
  if (vnew > vcrit && Math.abs(vnew - vold) > vt + vt) {
    lim.hit = true;
    if (vold > 0) {
      const arg = 1 + (vnew - vold) / vt;
      return arg > 0 ? vold + vt * Math.log(arg) : vcrit;
    }
    return vt * Math.log(vnew / vt);
  }
  if (vnew < 0) {
    const arg = vold > 0 ? -1 * vold - 1 : 2 * vold - 1;
    if (vnew < arg) {
      lim.hit = true;
      return arg;
    }
  }
  return vnew;
}

/** Junction current and conductance (ngspice dioload/bjtload): forward exponential, reverse cubic, breakdown. */
function junction(v: number, is: number, vte: number, xbv: number, out: Float64Array): void {
  if (v >= -3 * vte) {
    const ev = Math.exp(v / vte);
    out[0] = is * (ev - 1);
    out[1] = (is * ev) / vte;
  } else if (v >= -xbv) {
    let arg = (3 * vte) / (v * Math.E);
    arg = arg * arg * arg;
    out[0] = -is * (1 + arg);
    out[1] = (is * 3 * arg) / v;
  } else {
    const ev = Math.exp(-(xbv + v) / vte);
    out[0] = -is * ev;
    out[1] = (is * ev) / vte;
  }
}

interface Work {
  a: Float64Array;
  b: Float64Array;
  x: Float64Array;
  xn: Float64Array;
  ws: LuWorkspace;
  jv: Float64Array;
  lim: { hit: boolean };
  /** Factorisations that needed the dense pivoting path. */
  denseFallbacks: number;
}

interface AttemptConfig {
  maxIter: number;
  srcScale: number;
  gshunt: number;
  maxStep: number;
  reltol: number;
  vntol: number;
  abstol: number;
  /** First iteration sets junctions to their critical voltages (SPICE MODEINITJCT) instead of from x. */
  initJunctions: boolean;
  /** Called with the assembled, reordered n×n matrix and right-hand side before each factorisation (benchmark use). */
  capture?: (a: Float64Array, b: Float64Array) => void;
}

/** Evaluates the devices at the (limited) junction voltages of the iterate x; stores companion models on them. */
function evaluateDevices(sys: System, w: Work, first: boolean): void {
  const { diodes, bjts } = sys;
  const { x, jv, lim } = w;
  for (let di = 0; di < diodes.length; di++) {
    const d = diodes[di] as DiodeDev;
    let vd = (x[d.a] as number) - (x[d.k] as number);
    if (first) vd = d.vold;
    else if (d.xbv < Infinity && vd < Math.min(0, -d.xbv + 10 * d.vte)) {
      vd = -(pnjlim(-(vd + d.xbv), -(d.vold + d.xbv), d.vte, d.vcrit, lim) + d.xbv);
    } else vd = pnjlim(vd, d.vold, d.vte, d.vcrit, lim);
    d.vold = vd;
    junction(vd, d.is, d.vte, d.xbv, jv);
    const gd = (jv[1] as number) + GMIN;
    d.gd = gd;
    d.ieq = (jv[0] as number) + GMIN * vd - gd * vd;
  }
  for (let qi = 0; qi < bjts.length; qi++) {
    const q = bjts[qi] as BjtDev;
    const p = q.pol;
    let vbe = p * ((x[q.b] as number) - (x[q.e] as number));
    let vbc = p * ((x[q.b] as number) - (x[q.c] as number));
    if (first) {
      vbe = q.vbe;
      vbc = q.vbc;
    } else {
      vbe = pnjlim(vbe, q.vbe, VT, q.vcrit, lim);
      vbc = pnjlim(vbc, q.vbc, VT, q.vcrit, lim);
    }
    q.vbe = vbe;
    q.vbc = vbc;
    junction(vbe, q.is, q.vtf, Infinity, jv);
    const cbe = jv[0] as number;
    const gbe = jv[1] as number;
    junction(vbc, q.is, q.vtr, Infinity, jv);
    const cbc = jv[0] as number;
    const gbc = jv[1] as number;
    const ic = cbe - cbc - cbc / q.br - GMIN * vbc;
    const ib = cbe / q.bf + GMIN * vbe + cbc / q.br + GMIN * vbc;
    q.g11 = gbe;
    q.g12 = -(gbc + gbc / q.br + GMIN);
    q.g21 = gbe / q.bf + GMIN;
    q.g22 = gbc / q.br + GMIN;
    q.ceq = p * (ic - q.g11 * vbe - q.g12 * vbc);
    q.beq = p * (ib - q.g21 * vbe - q.g22 * vbc);
  }
}

/** Assembles the linearised MNA system into w.a / w.b from the linear part and the device companion models. */
function assemble(sys: System, w: Work, cfg: AttemptConfig): void {
  const { n, s, a0, bsrc, diodes, bjts, isNode } = sys;
  const { a, b } = w;
  a.set(a0);
  for (let i = 0; i < s; i++) b[i] = cfg.srcScale * (bsrc[i] as number);
  if (cfg.gshunt > 0) for (let i = 0; i < n; i++) if (isNode[i]) a[i * s + i] = (a[i * s + i] as number) + cfg.gshunt;
  for (let di = 0; di < diodes.length; di++) {
    const d = diodes[di] as DiodeDev;
    const gd = d.gd;
    const ieq = d.ieq;
    const ra = d.a * s;
    const rk = d.k * s;
    a[ra + d.a] = (a[ra + d.a] as number) + gd;
    a[rk + d.k] = (a[rk + d.k] as number) + gd;
    a[ra + d.k] = (a[ra + d.k] as number) - gd;
    a[rk + d.a] = (a[rk + d.a] as number) - gd;
    b[d.a] = (b[d.a] as number) - ieq;
    b[d.k] = (b[d.k] as number) + ieq;
  }
  for (let qi = 0; qi < bjts.length; qi++) {
    const q = bjts[qi] as BjtDev;
    const { g11, g12, g21, g22, ceq, beq } = q;
    const rc = q.c * s;
    const rb = q.b * s;
    const re = q.e * s;
    a[rc + q.b] = (a[rc + q.b] as number) + (g11 + g12);
    a[rc + q.e] = (a[rc + q.e] as number) - g11;
    a[rc + q.c] = (a[rc + q.c] as number) - g12;
    b[q.c] = (b[q.c] as number) - ceq;
    a[rb + q.b] = (a[rb + q.b] as number) + (g21 + g22);
    a[rb + q.e] = (a[rb + q.e] as number) - g21;
    a[rb + q.c] = (a[rb + q.c] as number) - g22;
    b[q.b] = (b[q.b] as number) - beq;
    a[re + q.b] = (a[re + q.b] as number) - (g11 + g12 + g21 + g22);
    a[re + q.e] = (a[re + q.e] as number) + (g11 + g21);
    a[re + q.c] = (a[re + q.c] as number) + (g12 + g22);
    b[q.e] = (b[q.e] as number) + (ceq + beq);
  }
}

/** Runs Newton–Raphson from w.x. */
function newton(sys: System, w: Work, cfg: AttemptConfig): { ok: boolean; iterations: number; singular?: number } {
  const { n, diodes, bjts, isNode, pattern } = sys;
  const { a, b, x, xn, ws, lim } = w;
  const nonlinear = diodes.length + bjts.length > 0;
  x[n] = 0;
  // junction states from the start point
  for (const d of diodes) d.vold = cfg.initJunctions ? d.vcrit : (x[d.a] as number) - (x[d.k] as number);
  for (const q of bjts) {
    q.vbe = cfg.initJunctions ? q.vcrit : q.pol * ((x[q.b] as number) - (x[q.e] as number));
    q.vbc = cfg.initJunctions ? 0 : q.pol * ((x[q.b] as number) - (x[q.c] as number));
  }
  for (let iter = 1; iter <= cfg.maxIter; iter++) {
    lim.hit = false;
    const first = iter === 1;
    evaluateDevices(sys, w, first);
    assemble(sys, w, cfg);
    if (cfg.capture) cfg.capture(a, b);
    // sparse LU along the fill-reducing order; if a diagonal pivot is too weak, re-assemble and pivot densely
    if (luSparseFactor(a, pattern)) luSparseSolve(a, pattern, b, xn);
    else {
      w.denseFallbacks++;
      assemble(sys, w, cfg);
      const sing = luFactor(a, ws);
      if (sing >= 0) return { ok: false, iterations: iter, singular: sing };
      luSolve(a, ws, b, xn);
    }
    if (!nonlinear) {
      x.set(xn.subarray(0, n));
      return { ok: true, iterations: iter };
    }
    // damping (fall-back attempts only): limit the largest node-voltage step
    if (cfg.maxStep < Infinity) {
      let maxd = 0;
      for (let i = 0; i < n; i++) if (isNode[i]) maxd = Math.max(maxd, Math.abs((xn[i] as number) - (x[i] as number)));
      if (maxd > cfg.maxStep) {
        const f = cfg.maxStep / maxd;
        for (let i = 0; i < n; i++) xn[i] = (x[i] as number) + f * ((xn[i] as number) - (x[i] as number));
        lim.hit = true;
      }
    }
    let conv = !lim.hit && !first;
    for (let i = 0; i < n; i++) {
      const xo = x[i] as number;
      const xv = xn[i] as number;
      if (!Number.isFinite(xv)) return { ok: false, iterations: iter };
      if (conv) {
        const tol = cfg.reltol * Math.max(Math.abs(xo), Math.abs(xv)) + (isNode[i] ? cfg.vntol : cfg.abstol);
        if (Math.abs(xv - xo) > tol) conv = false;
      }
      x[i] = xv;
    }
    if (conv) return { ok: true, iterations: iter };
  }
  return { ok: false, iterations: cfg.maxIter };
}

function describeSingular(sys: System, newCol: number): string {
  const col = sys.order[newCol] as number;
  if (col < sys.nodeCount) return `singular matrix at node ${sys.nodeNames[col]} (floating node or no DC path?)`;
  return `singular matrix at the branch of ${sys.branchNames[col - sys.nodeCount]} (a loop of voltage sources or inductors?)`;
}

/** DC operating point: MNA + Newton–Raphson with pnjlim; damped Newton, gmin stepping, source stepping as fall-backs. */
export function solveOp(circuit: Circuit, options: SolveOptions = {}): OpResult {
  let sys: System;
  try {
    sys = compile(circuit, options.extraNodes ?? []);
  } catch (err) {
    return { converged: false, nodes: {}, sources: {}, currents: {}, iterations: 0, message: (err as Error).message };
  }
  const { n, s } = sys;
  const w: Work = {
    a: buffers(s).a,
    b: new Float64Array(s),
    x: new Float64Array(s),
    xn: new Float64Array(s),
    ws: luWorkspace(n, s),
    jv: new Float64Array(2),
    lim: { hit: false },
    denseFallbacks: 0,
  };
  let warm = false;
  const ig = options.initialGuess;
  if (ig instanceof Float64Array) {
    if (ig.length === n) {
      w.x.set(ig);
      warm = true;
    }
  } else if (ig) {
    for (const [k, v] of Object.entries(ig)) {
      const i = sys.nodeIndex.get(k.toLowerCase());
      if (i !== undefined && Number.isFinite(v)) {
        w.x[i] = v;
        warm = true;
      }
    }
  }
  const start = new Float64Array(w.x);
  const base: AttemptConfig = {
    maxIter: options.maxIterations ?? 150,
    srcScale: 1,
    gshunt: 0,
    maxStep: Infinity,
    reltol: options.reltol ?? 1e-6,
    vntol: options.vntol ?? 1e-9,
    abstol: options.abstol ?? 1e-14,
    initJunctions: !warm,
  };
  let total = 0;
  const nonlinear = sys.diodes.length + sys.bjts.length > 0;
  let r = newton(sys, w, base);
  total += r.iterations;
  let method: SolveMethod = nonlinear ? 'newton' : 'linear';
  if (r.singular !== undefined) {
    return { converged: false, nodes: {}, sources: {}, currents: {}, iterations: total, message: describeSingular(sys, r.singular) };
  }
  if (!r.ok && warm) {
    // a stale warm start: retry cold
    w.x.fill(0);
    r = newton(sys, w, { ...base, initJunctions: true });
    total += r.iterations;
  }
  if (!r.ok) {
    method = 'damped';
    w.x.set(start);
    r = newton(sys, w, { ...base, maxIter: base.maxIter * 4, maxStep: 1 });
    total += r.iterations;
  }
  if (!r.ok) {
    method = 'gmin';
    w.x.fill(0);
    let ok = true;
    let first = true;
    for (let g = 1e-2; g >= 1e-13; g /= 10) {
      const rr = newton(sys, w, { ...base, gshunt: g, initJunctions: first });
      first = false;
      total += rr.iterations;
      if (!rr.ok) {
        ok = false;
        break;
      }
    }
    if (ok) {
      r = newton(sys, w, { ...base, initJunctions: false });
      total += r.iterations;
    }
  }
  if (!r.ok) {
    method = 'source';
    w.x.fill(0);
    let ok = true;
    let first = true;
    for (let k = 1; k <= 20; k++) {
      const rr = newton(sys, w, { ...base, srcScale: k / 20, initJunctions: first, maxIter: base.maxIter * 2 });
      first = false;
      total += rr.iterations;
      if (!rr.ok) {
        ok = false;
        break;
      }
    }
    r = { ok, iterations: 0 };
  }
  if (!r.ok) {
    return {
      converged: false,
      nodes: {},
      sources: {},
      currents: {},
      iterations: total,
      message: `no convergence after ${total} Newton iterations (plain, damped, gmin stepping and source stepping all failed)`,
    };
  }
  return report(sys, w.x, total, method);
}

function report(sys: System, x: Float64Array, iterations: number, method: SolveMethod): OpResult {
  const { n, nodeNames, nodeIndex, branchNames, nodeCount } = sys;
  const nodes: Record<string, number> = {};
  for (let i = 0; i < nodeCount; i++) nodes[nodeNames[i] as string] = x[nodeIndex.get(nodeNames[i] as string) as number] as number;
  const sources: Record<string, number> = {};
  for (let i = 0; i < branchNames.length; i++) sources[branchNames[i] as string] = x[sys.branchOf.get(branchNames[i] as string) as number] as number;
  const v = (name: string) => {
    const i = nodeIndex.get(name);
    return i === undefined ? 0 : (x[i] as number);
  };
  const currents: Record<string, number> = {};
  let qi = 0;
  let di = 0;
  for (const e of sys.elements) {
    switch (e.kind) {
      case 'R':
        currents[e.name] = (v(e.nodes[0]) - v(e.nodes[1])) / e.value;
        break;
      case 'C':
        currents[e.name] = 0;
        break;
      case 'I':
        currents[e.name] = e.value;
        break;
      case 'V':
      case 'L':
      case 'E':
      case 'H':
        currents[e.name] = x[sys.branchOf.get(e.name.toLowerCase()) as number] as number;
        break;
      case 'G':
        currents[e.name] = e.gain * (v(e.nodes[2]) - v(e.nodes[3]));
        break;
      case 'F':
        currents[e.name] = e.gain * (x[sys.branchOf.get(e.control.toLowerCase()) as number] as number);
        break;
      case 'D': {
        const d = sys.diodes[di++] as DiodeDev;
        const vd = (d.a === n ? 0 : (x[d.a] as number)) - (d.k === n ? 0 : (x[d.k] as number));
        const jv = new Float64Array(2);
        junction(vd, d.is, d.vte, d.xbv, jv);
        currents[e.name] = (jv[0] as number) + GMIN * vd;
        break;
      }
      case 'Q': {
        const q = sys.bjts[qi++] as BjtDev;
        const xv = (i: number) => (i === n ? 0 : (x[i] as number));
        const vbe = q.pol * (xv(q.b) - xv(q.e));
        const vbc = q.pol * (xv(q.b) - xv(q.c));
        const jv = new Float64Array(2);
        junction(vbe, q.is, q.vtf, Infinity, jv);
        const cbe = jv[0] as number;
        junction(vbc, q.is, q.vtr, Infinity, jv);
        const cbc = jv[0] as number;
        const ic = q.pol * (cbe - cbc - cbc / q.br - GMIN * vbc);
        const ib = q.pol * (cbe / q.bf + GMIN * vbe + cbc / q.br + GMIN * vbc);
        currents[e.name] = ic;
        currents[`${e.name}:b`] = ib;
        currents[`${e.name}:e`] = -(ic + ib);
        break;
      }
    }
  }
  return { converged: true, nodes, sources, currents, iterations, method, x: new Float64Array(x.subarray(0, n)) };
}

/**
 * The Newton-loop linear system at the operating point of a circuit: the n×n MNA Jacobian (row-major, no reference
 * row, in the solver's fill-reducing order) and right-hand side exactly as the solver factors them. Used by the benchmark to compare linear solvers.
 */
export function newtonSystem(
  circuit: Circuit,
): { n: number; a: Float64Array; b: Float64Array; strided: Float64Array; pattern: SparsePattern } | undefined {
  const first = solveOp(circuit);
  if (!first.converged || !first.x) return undefined;
  const sys = compile(circuit, []);
  const { n, s } = sys;
  const w: Work = {
    a: buffers(s).a,
    b: new Float64Array(s),
    x: new Float64Array(s),
    xn: new Float64Array(s),
    ws: luWorkspace(n, s),
    jv: new Float64Array(2),
    lim: { hit: false },
    denseFallbacks: 0,
  };
  w.x.set(first.x);
  let out: { n: number; a: Float64Array; b: Float64Array; strided: Float64Array; pattern: SparsePattern } | undefined;
  newton(sys, w, {
    maxIter: 1,
    srcScale: 1,
    gshunt: 0,
    maxStep: Infinity,
    reltol: 1e-6,
    vntol: 1e-9,
    abstol: 1e-14,
    initJunctions: false,
    capture: (a, b) => {
      const m = new Float64Array(n * n);
      for (let i = 0; i < n; i++) m.set(a.subarray(i * s, i * s + n), i * n);
      out = { n, a: m, b: new Float64Array(b.subarray(0, n)), strided: new Float64Array(a), pattern: sys.pattern };
    },
  });
  return out;
}
