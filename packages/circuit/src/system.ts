/**
 * The compiled MNA system of one circuit structure (compile.ts builds it): its numbering, sparse LU program and stamp
 * positions (Topology), and the value and scratch arrays of a solve (Work), allocated once per structure.
 */
import type { LuProgram, LuWorkspace } from './lu';
import type { Repivot } from './repivot';

/** Values and scratch of one solve; allocated once per topology (solving is synchronous, so it is reused). */
export interface Work {
  /** Linear stamps (compressed, position nnz is the spare slot) and the source vector. */
  base: Float64Array;
  rhs0: Float64Array;
  /** Assembled Jacobian of the current iteration, and the copy that is factored in place. */
  asm: Float64Array;
  fac: Float64Array;
  /** Right-hand side, iterate and next iterate; index n is the reference (always 0). */
  b: Float64Array;
  x: Float64Array;
  xn: Float64Array;
  /** Column scales of the linear part (per solve) and of the assembled matrix (per iteration). */
  scale0: Float64Array;
  scale: Float64Array;
  /** Dense pivoting fall-back, allocated the first time a sparse pivot is too weak. */
  dense?: { a: Float64Array; ws: LuWorkspace };
  denseFallbacks: number;
  /** Scratch of iterative refinement (newton.ts), allocated when first needed. */
  res?: Float64Array;
  dx?: Float64Array;
  /** Per unknown: |correction| of the last refinement, an estimate of the solve's rounding error; set when refined. */
  floor?: Float64Array;
  refined?: boolean;
  /** Second sparse pivot order, from the rows the dense fall-back chose (repivot.ts), and how many were built. */
  repivot?: Repivot;
  repivots: number;
  /** Diode values (IS·area, N·VT, critical voltage, adjusted BV) and junction state. */
  dIs: Float64Array;
  dVte: Float64Array;
  dVcrit: Float64Array;
  dXbv: Float64Array;
  dVold: Float64Array;
  /** BJT values (polarity, IS·area, BF, BR, NF·VT, NR·VT, critical voltage) and junction state. */
  qPol: Float64Array;
  qIs: Float64Array;
  qBf: Float64Array;
  qBr: Float64Array;
  qVtf: Float64Array;
  qVtr: Float64Array;
  qVcrit: Float64Array;
  qVbe: Float64Array;
  qVbc: Float64Array;
  /** Gummel–Poon values (devices.ts gummelPoon): leakage IS·area and N·VT, 1/VAF, 1/VAR, area/IKF, area/IKR, NKF. */
  qIse: Float64Array;
  qVte: Float64Array;
  qIsc: Float64Array;
  qVtc: Float64Array;
  qInvVaf: Float64Array;
  qInvVar: Float64Array;
  qOik: Float64Array;
  qOikr: Float64Array;
  qNkf: Float64Array;
  /** Base resistance: RBM/area, (RB − RBM)/area, IRB·area; the slot of a modulated RB (−1: linear) and its 1/RB part. */
  qRbpr: Float64Array;
  qRbpi: Float64Array;
  qXjrb: Float64Array;
  qGxSlot: Int32Array;
  qGx0: Float64Array;
}

export interface Topology {
  /** The structure codes this was compiled from (cache key, compared in full on a hash hit). */
  codes: Int32Array;
  /** Unknowns: node voltages then branch currents, numbered in elimination order ("solution index"). */
  n: number;
  nodeCount: number;
  nodeNames: string[];
  branchNames: string[];
  /** Solution index of node i / branch i of the name lists above. */
  nodeX: Int32Array;
  branchX: Int32Array;
  nodeIndex: Map<string, number>;
  /** Lower-case flat name of a V, L, E or H element → solution index of its branch current. */
  branchOf: Map<string, number>;
  /** isNode[i]: unknown i is a node voltage, not a branch current. */
  isNode: Uint8Array;
  /** Per solution index: a name for messages about a singular matrix. */
  describe: string[];
  lu: LuProgram;
  /** Per element: where its stamp slots start in `slots` (positions, right-hand-side rows; layout by kind). */
  slotStart: Int32Array;
  slots: Int32Array;
  /** Per element: solution indices of its nodes, 4 per element (n = reference). */
  xOf: Int32Array;
  /** Diagonal positions of island nodes (GISLAND) and of every node (gmin stepping's shunt). */
  islandPos: Int32Array;
  shuntPos: Int32Array;
  /** Per node (as shuntPos): the row of its KCL and its solution index (pseudo-transient companion sources). */
  shuntRow: Int32Array;
  shuntX: Int32Array;
  /** Diodes: element index, 4 positions (aa, kk, ak, ka), 2 rows (a, k), 2 solution indices (a, k). */
  dEl: Int32Array;
  dPos: Int32Array;
  dRow: Int32Array;
  dX: Int32Array;
  /** BJTs: element index, 9 positions (rows c, b, e × columns b, e, c), 3 rows and 3 solution indices (c, b, e). */
  qEl: Int32Array;
  qPos: Int32Array;
  qRow: Int32Array;
  qX: Int32Array;
  work: Work;
}

/** The arrays of a solve for n unknowns, `slots` compressed matrix positions (spare slot included), nd diodes, nq BJTs. */
export function allocateWork(n: number, slots: number, nd: number, nq: number): Work {
  const f = (m: number) => new Float64Array(m);
  return {
    base: f(slots),
    rhs0: f(n + 1),
    asm: f(slots),
    fac: f(slots),
    b: f(n + 1),
    x: f(n + 1),
    xn: f(n + 1),
    scale0: f(n),
    scale: f(n),
    denseFallbacks: 0,
    repivots: 0,
    dIs: f(nd),
    dVte: f(nd),
    dVcrit: f(nd),
    dXbv: f(nd),
    dVold: f(nd),
    qPol: f(nq),
    qIs: f(nq),
    qBf: f(nq),
    qBr: f(nq),
    qVtf: f(nq),
    qVtr: f(nq),
    qVcrit: f(nq),
    qVbe: f(nq),
    qVbc: f(nq),
    qIse: f(nq),
    qVte: f(nq),
    qIsc: f(nq),
    qVtc: f(nq),
    qInvVaf: f(nq),
    qInvVar: f(nq),
    qOik: f(nq),
    qOikr: f(nq),
    qNkf: f(nq),
    qRbpr: f(nq),
    qRbpi: f(nq),
    qXjrb: f(nq),
    qGxSlot: new Int32Array(nq),
    qGx0: f(nq),
  };
}
