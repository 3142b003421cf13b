/**
 * Fast fault simulation from the healthy board's factorisation.
 *
 * A fault on a linear part (a resistor open, shorted or drifted, a capacitor shorted or leaky, a transistor's
 * collector–emitter short …) changes the MNA matrix by a few conductance stamps between nets that already exist:
 * the "fault rubber stamps" of FASTNR (Soares Augusto & Beltrán Almeida, fast fault simulation with Newton–
 * Raphson and rubber stamps; from memory). Instead of compiling and factoring the faulted circuit, the solve keeps
 * the healthy matrix A₀ factored once and applies the change D = U M Vᵀ with the Sherman–Morrison–Woodbury
 * identity (Hager, "Updating the inverse of a matrix", SIAM Review 31(2), 1989, eq. (1.2)):
 *
 *   (A₀ + U M Vᵀ)⁻¹ b = y − Z (I + M Vᵀ Z)⁻¹ M Vᵀ y,   y = A₀⁻¹ b,  Z = A₀⁻¹ U,
 *
 * with U and V unit columns of the rows and columns that D touches. Z's columns are solves with A₀'s factors,
 * cached per row, so a fault costs a few triangular solves and a k×k system, k the rows it touches.
 *
 * Nonlinear boards: Newton continues from the healthy solution. Each iteration's Jacobian differs from the
 * healthy one in the fault stamps plus the junctions whose operating point moved; that difference is again low
 * rank and solved the same way, so Newton keeps its quadratic convergence without a factorisation. When the
 * difference touches too many rows (a refactorisation is then cheaper), Newton does not settle within a few
 * iterations, or the change is not a conductance stamp at all (a part removed that is not a resistor, a source
 * changed, new nets), the faulted circuit is solved in full (solveNodes, warm-started from the healthy solution).
 * Where each case applies: docs/decisions/0006-fast-fault-simulation.md.
 */
import type { Circuit, Element } from './circuit';
import type { Topology } from './system';
import { stampJunctions } from './devices';
import { luFactor, luProgramToDense, luSolve, luWorkspace, type LuWorkspace } from './lu';
import { solveNodes, type SolveOptions } from './solver';
import { stampValues } from './stamp';
import { topologyOf } from './structure-cache';

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
  method: FaultMethod;
  /** Newton steps (2 for a linear board: the solve and one refinement). */
  iterations: number;
}

/** Newton iterations allowed before the full solve takes over (a fault that moves junctions far does not settle). */
const MAX_ITERATIONS = 12;
/**
 * Step tolerances of the fast Newton: the solver's own defaults (solver.ts baseConfig), tighter than SPICE's; a
 * net's voltage tolerance is widened by the current tolerance times its driving-point resistance, since a net on
 * tens of megohms carries a rounding noise that no step gets below (ngspice checks currents against ABSTOL for
 * the same reason; ngspice manual, ch. 15 ".options").
 */
const RELTOL = 1e-6;
const VNTOL = 1e-9;
const ABSTOL = 1e-14;
/** Rank of the change always taken by Woodbury, however small the circuit. */
const MAX_RANK_FLOOR = 16;

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

class Solution implements FaultSolution {
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
}

/**
 * A board state solved once, healthy, with its Jacobian factored: faults given as rubber stamps are then solved
 * from it (`solve`). One instance per circuit; not re-entrant (it reuses the compiled topology's work arrays).
 */
export class HealthyFactor {
  private readonly n: number;
  private readonly nonlinear: boolean;
  /** Healthy solution, dense healthy Jacobian (rows × solution indices) and its factors. */
  private readonly x0: Float64Array;
  private readonly a0: Float64Array;
  private readonly f0: Float64Array;
  private readonly ws: LuWorkspace;
  /** Per node solution index: its KCL row. */
  private readonly rowOfX: Int32Array;
  /** Solution indices of nodes the healthy structure ties to the reference by GISLAND (no DC path of their own). */
  private readonly islands = new Set<number>();
  /** A₀⁻¹ e_r by row r (Z's columns), computed when a change first touches row r. */
  private readonly zCols = new Map<number, Float64Array>();
  private readonly dense: Float64Array;
  /** Per solution index: step tolerance beyond RELTOL (see ABSTOL), computed on the first solve. */
  private floor?: Float64Array;
  private readonly b: Float64Array;
  private readonly y: Float64Array;

  private constructor(
    private readonly circuit: Circuit,
    private readonly top: Topology,
    private readonly options: SolveOptions,
    x0: Float64Array,
  ) {
    const n = top.n;
    this.n = n;
    this.nonlinear = top.dEl.length + top.qEl.length > 0;
    this.x0 = new Float64Array(n + 1);
    this.x0.set(x0);
    this.rowOfX = new Int32Array(n + 1).fill(-1);
    for (let i = 0; i < top.shuntX.length; i++) this.rowOfX[top.shuntX[i] as number] = top.shuntRow[i] as number;
    const islandPos = new Set(top.islandPos);
    for (let i = 0; i < top.shuntPos.length; i++) if (islandPos.has(top.shuntPos[i] as number)) this.islands.add(top.shuntX[i] as number);
    this.dense = new Float64Array(n * n);
    this.b = new Float64Array(n + 1);
    this.y = new Float64Array(n);
    this.assembleAt(this.x0);
    this.a0 = this.dense.slice();
    this.f0 = this.dense.slice();
    this.ws = luWorkspace(n);
    if (luFactor(this.f0, this.ws) >= 0) throw new Error('the healthy Jacobian is singular');
  }

  /** Solves the healthy circuit and factors its Jacobian; undefined when the healthy circuit does not solve. */
  static prepare(circuit: Circuit, options: SolveOptions = {}): HealthyFactor | undefined {
    try {
      const sol = solveNodes(circuit, options);
      const top = topologyOf(circuit, options.extraNodes ?? []);
      return new HealthyFactor(circuit, top, options, sol.x);
    } catch {
      return undefined;
    }
  }

  /** Healthy node voltages. */
  healthy(): FaultSolution {
    return new Solution(this.x0, this.top.nodeIndex, 'woodbury', 0);
  }

  /**
   * The healthy board's driving-point resistance at a net, ohm: the voltage a 1 A error in its KCL would move it
   * by ((A₀⁻¹)ᵢᵢ, the Jacobian's inverse). A current tolerance times this is the voltage tolerance of a net that
   * hangs on gigaohms. 0 for the reference or an unknown net.
   */
  drivingPoint(node: string): number {
    const x = this.top.nodeIndex.get(node);
    if (x === undefined) return 0;
    const r = this.rowOfX[x] as number;
    return r < 0 ? 0 : Math.abs(this.zCol(r)[x] as number);
  }

  /**
   * The circuit with the stamps applied. Falls back to a full solve (method 'full') where the fast path does not
   * apply; throws SolveError when the faulted circuit cannot be solved at all.
   */
  solve(stamps: readonly RubberStamp[]): FaultSolution {
    const fast = this.fast(stamps);
    if (fast) return fast;
    const extra = stamps.map((s, i): Element => ({ kind: 'R', name: `fault#${i}`, part: 'fault', nodes: [s.a, s.b], value: 1 / s.dg }));
    const sol = solveNodes({ ...this.circuit, elements: [...this.circuit.elements, ...extra] }, { ...this.options, initialGuess: this.healthyGuess() });
    return { voltage: (node) => sol.voltage(node), method: 'full', iterations: 0 };
  }

  private healthyGuess(): Record<string, number> {
    const out: Record<string, number> = {};
    for (const [name, i] of this.top.nodeIndex) out[name] = this.x0[i] as number;
    return out;
  }

  /** Dense Jacobian and right-hand side of the healthy circuit linearised at x (into this.dense, this.b); true if pnjlim limited a junction. */
  private assembleAt(x: Float64Array): boolean {
    const { top } = this;
    const w = stampValues(top, this.circuit.elements);
    w.x.set(x.subarray(0, top.n));
    w.x[top.n] = 0;
    // junction state from x, so that pnjlim limits each step against the previous iterate (as newton.ts)
    for (let i = 0; i < top.dEl.length; i++) w.dVold[i] = (x[top.dX[2 * i] as number] as number) - (x[top.dX[2 * i + 1] as number] as number);
    for (let i = 0; i < top.qEl.length; i++) {
      const pol = w.qPol[i] as number;
      const xb = x[top.qX[3 * i + 1] as number] as number;
      w.qVbe[i] = pol * (xb - (x[top.qX[3 * i + 2] as number] as number));
      w.qVbc[i] = pol * (xb - (x[top.qX[3 * i] as number] as number));
    }
    w.asm.set(w.base);
    w.b.set(w.rhs0);
    const limited = stampJunctions(top, w, false);
    luProgramToDense(w.asm, top.lu, this.dense);
    this.b.set(w.b.subarray(0, top.n));
    return limited;
  }

  private zCol(r: number): Float64Array {
    let z = this.zCols.get(r);
    if (!z) {
      const e = new Float64Array(this.n);
      e[r] = 1;
      z = new Float64Array(this.n);
      luSolve(this.f0, this.ws, e, z);
      this.zCols.set(r, z);
    }
    return z;
  }

  /** Adds the stamps to this.dense. */
  private addStamps(stamps: readonly RubberStamp[]): boolean {
    const { n, dense, rowOfX } = this;
    for (const s of stamps) {
      const xa = s.a === '0' ? n : this.top.nodeIndex.get(s.a);
      const xb = s.b === '0' ? n : this.top.nodeIndex.get(s.b);
      if (xa === undefined || xb === undefined) return false;
      // a stamp on an island may give it a DC path: the faulted structure then has no GISLAND there (full solve)
      if (this.islands.has(xa) || this.islands.has(xb)) return false;
      const ra = xa < n ? (rowOfX[xa] as number) : -1;
      const rb = xb < n ? (rowOfX[xb] as number) : -1;
      if ((xa < n && ra < 0) || (xb < n && rb < 0)) return false;
      if (ra >= 0) dense[ra * n + xa] = (dense[ra * n + xa] as number) + s.dg;
      if (rb >= 0) dense[rb * n + xb] = (dense[rb * n + xb] as number) + s.dg;
      if (ra >= 0 && rb >= 0) {
        dense[ra * n + xb] = (dense[ra * n + xb] as number) - s.dg;
        dense[rb * n + xa] = (dense[rb * n + xa] as number) - s.dg;
      }
    }
    return true;
  }

  /**
   * Newton from the healthy solution, each step by Woodbury; undefined where the full solve must take over. The
   * step is solved in residual form (J Δ = J x − b), so the rounding of the Woodbury correction (large when a short
   * of a fraction of an ohm meets a 300 V bus) only perturbs the step: the next step corrects it, as iterative
   * refinement does (Golub & Van Loan, Matrix Computations, 4th ed., §3.5.3). A linear board takes two steps.
   */
  private fast(stamps: readonly RubberStamp[]): FaultSolution | undefined {
    const { n, top, dense, b } = this;
    const x = this.x0.slice();
    const r = new Float64Array(n);
    const dx = new Float64Array(n);
    const floor = this.stepFloor();
    for (let iter = 1; iter <= MAX_ITERATIONS; iter++) {
      // a step limited by pnjlim is not converged, however small (as newton.ts)
      const limited = this.assembleAt(x);
      if (!this.addStamps(stamps)) return undefined;
      for (let i = 0; i < n; i++) {
        let s = -(b[i] as number);
        const ro = i * n;
        for (let j = 0; j < n; j++) s += (dense[ro + j] as number) * (x[j] as number);
        r[i] = s;
      }
      if (!this.woodbury(r, dx)) return undefined;
      let conv = iter > 1 && !limited;
      for (let i = 0; i < n; i++) {
        const xo = x[i] as number;
        const xv = xo - (dx[i] as number);
        if (!Number.isFinite(xv)) return undefined;
        const tol = RELTOL * Math.max(Math.abs(xo), Math.abs(xv)) + (floor[i] as number);
        if (Math.abs(xv - xo) > tol) conv = false;
        x[i] = xv;
      }
      if (conv) return new Solution(x, top.nodeIndex, this.nonlinear ? 'newton-woodbury' : 'woodbury', iter);
    }
    return undefined;
  }

  private stepFloor(): Float64Array {
    if (!this.floor) {
      const { n, top } = this;
      this.floor = new Float64Array(n);
      for (let x = 0; x < n; x++) {
        const r = this.rowOfX[x] as number;
        this.floor[x] = top.isNode[x] ? VNTOL + (r < 0 ? 0 : ABSTOL * Math.abs(this.zCol(r)[x] as number)) : ABSTOL;
      }
    }
    return this.floor;
  }

  /** Solves this.dense · out = rhs with A₀'s factors and the Woodbury correction for D = dense − A₀. */
  private woodbury(rhs: Float64Array, out: Float64Array): boolean {
    const { n, dense, a0 } = this;
    // rows and columns where the matrix differs from the healthy one
    const rows: number[] = [];
    const colSet = new Set<number>();
    for (let r = 0; r < n; r++) {
      let touched = false;
      const ro = r * n;
      for (let c = 0; c < n; c++) {
        if (dense[ro + c] === a0[ro + c]) continue;
        touched = true;
        colSet.add(c);
      }
      if (touched) rows.push(r);
    }
    // k column solves (O(k·n²) dense, cached across faults) and a k×k system: beyond half the rows (and a small
    // floor, where everything is cheap) a refactorisation of the faulted matrix costs less
    if (rows.length > Math.max(MAX_RANK_FLOOR, n / 2)) return false;
    luSolve(this.f0, this.ws, rhs, this.y);
    const y = this.y;
    if (rows.length === 0) {
      out.set(y);
      return true;
    }
    const cols = [...colSet];
    const k = rows.length;
    const z = rows.map((r) => this.zCol(r));
    // K = I + M Vᵀ Z (k×k), rhs = M Vᵀ y, with M = D[rows, cols]
    const kk = new Float64Array(k * k);
    const my = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      const ro = (rows[i] as number) * n;
      kk[i * k + i] = 1;
      let s = 0;
      for (const c of cols) {
        const d = (dense[ro + c] as number) - (a0[ro + c] as number);
        if (d === 0) continue;
        s += d * (y[c] as number);
        for (let j = 0; j < k; j++) kk[i * k + j] = (kk[i * k + j] as number) + d * ((z[j] as Float64Array)[c] as number);
      }
      my[i] = s;
    }
    const ws = luWorkspace(k);
    if (luFactor(kk, ws) >= 0) return false;
    const wv = new Float64Array(k);
    luSolve(kk, ws, my, wv);
    for (let i = 0; i < n; i++) {
      let s = y[i] as number;
      for (let j = 0; j < k; j++) s -= ((z[j] as Float64Array)[i] as number) * (wv[j] as number);
      out[i] = s;
    }
    return true;
  }
}
