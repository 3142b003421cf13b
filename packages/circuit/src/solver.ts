import type { Circuit } from './circuit';
import type { Topology, Work } from './system';
import { stampValues } from './stamp';
import { topologyOf } from './structure-cache';
import { bq, GMIN, gummelPoon, junction, jv } from './devices';
import { luProgramToDense, type LuProgram } from './lu';
import { newton, type AttemptConfig } from './newton';
import { solveChain, type SolveMethod } from './stepping';

export { VT, GMIN, GISLAND } from './devices';
export type { SolveMethod } from './stepping';

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

/**
 * The circuit could not be solved in this state: every strategy of the chain failed (or the matrix is singular).
 * Thrown by solveNodes and the meter functions (measure, measureDetailed, read) instead of any reading value; not a
 * MeasurementError, so a caller can tell "this reading has no prediction" from "this reading must not be taken".
 */
export class SolveError extends Error {
  constructor(
    message: string,
    /** Newton iterations spent over all strategies. */
    readonly iterations: number,
    /** The strategies tried, in order ('newton', 'damped', 'gmin', 'source', 'ptc'). */
    readonly strategies: readonly SolveMethod[],
  ) {
    super(`the model could not be solved in this state: ${message}`);
    this.name = 'SolveError';
  }
}

interface Failed extends OpResult {
  converged: false;
  tried: SolveMethod[];
}

function failed(message: string, iterations = 0, tried: SolveMethod[] = []): Failed {
  return { converged: false, nodes: {}, sources: {}, currents: {}, iterations, message, tried };
}

const STRATEGY: Record<SolveMethod, string> = {
  linear: 'linear solve',
  newton: 'Newton',
  damped: 'damped Newton',
  gmin: 'gmin stepping',
  source: 'source stepping',
  ptc: 'pseudo-transient continuation',
};

function baseConfig(options: SolveOptions, warm: boolean): AttemptConfig {
  return {
    maxIter: options.maxIterations ?? 150,
    srcScale: 1,
    gshunt: 0,
    maxStep: Infinity,
    reltol: options.reltol ?? 1e-6,
    vntol: options.vntol ?? 1e-9,
    abstol: options.abstol ?? 1e-14,
    initJunctions: !warm,
  };
}

/** Loads the warm start into w.x; false when there is none that fits this topology. */
function loadGuess(top: Topology, w: Work, guess: SolveOptions['initialGuess']): boolean {
  w.x.fill(0);
  if (guess instanceof Float64Array) {
    if (guess.length !== top.n) return false;
    w.x.set(guess);
    return true;
  }
  let warm = false;
  if (guess) {
    for (const k in guess) {
      const i = top.nodeIndex.get(k.toLowerCase());
      const v = guess[k] as number;
      if (i !== undefined && Number.isFinite(v)) {
        w.x[i] = v;
        warm = true;
      }
    }
  }
  return warm;
}

function compiled(circuit: Circuit, options: SolveOptions): Topology | string {
  try {
    return topologyOf(circuit, options.extraNodes ?? []);
  } catch (err) {
    return (err as Error).message;
  }
}

/** A converged solve, still in the topology's work arrays (valid until the next solve). */
interface Solved {
  top: Topology;
  w: Work;
  iterations: number;
  method: SolveMethod;
}

function solveIn(circuit: Circuit, options: SolveOptions): Solved | Failed {
  const top = compiled(circuit, options);
  if (typeof top === 'string') return failed(top);
  const w = stampValues(top, circuit.elements);
  const warm = loadGuess(top, w, options.initialGuess);
  const r = solveChain(top, w, baseConfig(options, warm), warm);
  if (r.singular !== undefined) {
    const what = top.describe[r.singular] as string;
    const hint = what.startsWith('node') ? '(floating node or no DC path?)' : '(a loop of voltage sources or inductors?)';
    return failed(`singular matrix at ${what} ${hint}`, r.iterations, r.tried);
  }
  if (!r.ok) {
    return failed(`no convergence after ${r.iterations} Newton iterations (${r.tried.map((m) => STRATEGY[m]).join(', ')} all failed)`, r.iterations, r.tried);
  }
  return { top, w, iterations: r.iterations, method: r.method };
}

/**
 * DC operating point: MNA + Newton–Raphson with pnjlim; damped Newton, gmin stepping, source stepping and
 * pseudo-transient continuation as fall-backs (stepping.ts). A failure is `converged: false` with a message. The structure is compiled once and cached (see compile.ts); each solve stamps the values anew.
 */
export function solveOp(circuit: Circuit, options: SolveOptions = {}): OpResult {
  const s = solveIn(circuit, options);
  if ('converged' in s) {
    return { converged: false, nodes: {}, sources: {}, currents: {}, iterations: s.iterations, message: s.message };
  }
  return report(s.top, circuit, s.w, s.iterations, s.method);
}

/**
 * The solution of solveOp without the per-element report (a class, not closures: it is made once per solve, and
 * some loaders wrap every closure they create in a naming call).
 */
export class NodeSolution {
  constructor(
    /** The solution vector, as OpResult.x. */
    readonly x: Float64Array,
    private readonly top: Topology,
  ) {}

  /** Voltage of a node by lower-case name (0 for the reference or a name not in the circuit). */
  voltage(node: string): number {
    const i = this.top.nodeIndex.get(node);
    return i === undefined ? 0 : (this.x[i] as number);
  }

  /** Every node voltage by name, as OpResult.nodes. */
  nodes(): Record<string, number> {
    const { nodeNames, nodeX } = this.top;
    const out: Record<string, number> = {};
    for (let i = 0; i < nodeNames.length; i++) out[nodeNames[i] as string] = this.x[nodeX[i] as number] as number;
    return out;
  }
}

/**
 * solveOp for a caller that reads a few node voltages (the meter): the same solve, without building the node,
 * source and current records of every element. Throws SolveError when it cannot be solved.
 */
export function solveNodes(circuit: Circuit, options: SolveOptions = {}): NodeSolution {
  const s = solveIn(circuit, options);
  if ('converged' in s) throw new SolveError(s.message ?? 'no convergence', s.iterations, s.tried);
  return new NodeSolution(s.w.x.slice(0, s.top.n), s.top);
}

function report(top: Topology, circuit: Circuit, w: Work, iterations: number, method: SolveMethod): OpResult {
  const { n, nodeNames, nodeX, branchNames, branchX, xOf } = top;
  const x = w.x;
  x[n] = 0;
  const nodes: Record<string, number> = {};
  for (let i = 0; i < nodeNames.length; i++) nodes[nodeNames[i] as string] = x[nodeX[i] as number] as number;
  const sources: Record<string, number> = {};
  for (let i = 0; i < branchNames.length; i++) sources[branchNames[i] as string] = x[branchX[i] as number] as number;
  const currents: Record<string, number> = {};
  const v = (ei: number, t: number) => x[xOf[4 * ei + t] as number] as number;
  let di = 0;
  let qi = 0;
  circuit.elements.forEach((e, ei) => {
    switch (e.kind) {
      case 'R':
        currents[e.name] = (v(ei, 0) - v(ei, 1)) / e.value;
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
        currents[e.name] = x[top.branchOf.get(e.name.toLowerCase()) as number] as number;
        break;
      case 'G':
        currents[e.name] = e.gain * (v(ei, 2) - v(ei, 3));
        break;
      case 'F':
        currents[e.name] = e.gain * (x[top.branchOf.get(e.control.toLowerCase()) as number] as number);
        break;
      case 'D': {
        const vd = (x[top.dX[2 * di] as number] as number) - (x[top.dX[2 * di + 1] as number] as number);
        junction(vd, w.dIs[di] as number, w.dVte[di] as number, w.dXbv[di] as number);
        currents[e.name] = jv.i + GMIN * vd;
        di++;
        break;
      }
      case 'Q': {
        const pol = w.qPol[qi] as number;
        const xb = x[top.qX[3 * qi + 1] as number] as number;
        const vbe = pol * (xb - (x[top.qX[3 * qi + 2] as number] as number));
        const vbc = pol * (xb - (x[top.qX[3 * qi] as number] as number));
        gummelPoon(w, qi, vbe, vbc);
        const ic = pol * bq.ic;
        const ib = pol * bq.ib;
        currents[e.name] = ic;
        currents[`${e.name}:b`] = ib;
        currents[`${e.name}:e`] = -(ic + ib);
        qi++;
        break;
      }
    }
  });
  return { converged: true, nodes, sources, currents, iterations, method, x: x.slice(0, n) };
}

/** The Newton-loop linear system at an operating point, exactly as the solver factors it (benchmark use). */
export interface NewtonSystem {
  n: number;
  /** Dense n×n row-major Jacobian (rows and columns in the solver's order) and right-hand side. */
  a: Float64Array;
  b: Float64Array;
  /** The same Jacobian as compressed values along `program`. */
  values: Float64Array;
  program: LuProgram;
}

/** Captures the Jacobian of one Newton iteration at the converged operating point of a circuit. */
export function newtonSystem(circuit: Circuit): NewtonSystem | undefined {
  const first = solveOp(circuit);
  if (!first.converged || !first.x) return undefined;
  const top = topologyOf(circuit, []);
  const w = stampValues(top, circuit.elements);
  w.x.set(first.x);
  const { n, lu } = top;
  let out: NewtonSystem | undefined;
  newton(top, w, {
    ...baseConfig({}, true),
    maxIter: 1,
    capture: (a, b) => {
      const dense = new Float64Array(n * n);
      luProgramToDense(a, lu, dense);
      out = { n, a: dense, b: b.slice(0, n), values: a.slice(), program: lu };
    },
  });
  return out;
}
