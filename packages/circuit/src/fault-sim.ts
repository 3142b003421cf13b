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
import { Solution, type FaultSolution, type RubberStamp } from './rubber-stamps';
import type { Topology } from './system';
import { stampJunctions } from './devices';
import { luColumnScale, luFactor, luProgramFactor, luProgramSolve, luProgramToDense, luSolve, luWorkspace, type LuWorkspace } from './lu';
import { solveNodes, type SolveOptions } from './solver';
import { stampValues } from './stamp';
import { topologyOf } from './structure-cache';

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
 * A board state solved once, healthy, with its Jacobian factored: faults given as rubber stamps are then solved
 * from it (`solve`). One instance per circuit; not re-entrant (it reuses the compiled topology's work arrays).
 * The Jacobian is kept in the topology's sparse positions (lu.ts LuProgram): a step's residual and its difference
 * from the healthy Jacobian cost the non-zeros, not n²; only A₀'s factors are dense.
 */
export class HealthyFactor {
  private readonly n: number;
  private readonly nonlinear: boolean;
  /**
   * Healthy solution, healthy Jacobian values (per sparse position) and A₀'s factors: sparse along the compiled
   * program (`sparse`), dense with pivoting (`f0`, `ws`) where a pivot of the compiled order is too weak.
   */
  private readonly x0: Float64Array;
  private readonly vals0: Float64Array;
  private readonly sparse?: Float64Array;
  private readonly f0?: Float64Array;
  private readonly ws?: LuWorkspace;
  /** Per node solution index: its KCL row. */
  private readonly rowOfX: Int32Array;
  /** Solution indices of nodes the healthy structure ties to the reference by GISLAND (no DC path of their own). */
  private readonly islands = new Set<number>();
  /** A₀⁻¹ e_r by row r (Z's columns), computed when a change first touches row r. */
  private readonly zCols = new Map<number, Float64Array>();
  /** Per solution index: step tolerance beyond RELTOL (see ABSTOL), computed on the first solve. */
  private floor?: Float64Array;
  /** The values of the linear stamps and sources (stampValues), kept so that a step stamps only the junctions. */
  private readonly base: Float64Array;
  private readonly rhs0: Float64Array;
  /** Work of a step: Jacobian values, right-hand side, residual, solves. */
  private readonly vals: Float64Array;
  private readonly b: Float64Array;
  private readonly r: Float64Array;
  private readonly dx: Float64Array;
  private readonly y: Float64Array;
  /** Row → its index among the rows a step's change touches (-1 when untouched), and those rows. */
  private readonly slot: Int32Array;
  private readonly rows: Int32Array;
  /** Largest rank of a change taken by Woodbury, and the buffers of its k×k system. */
  private readonly maxRank: number;
  private readonly kk: Float64Array;
  private readonly my: Float64Array;
  private readonly wv: Float64Array;
  private readonly zs: Float64Array[] = [];
  private readonly kws: LuWorkspace[] = [];
  /** Entries of a step's change (row, solution index, value). */
  private er = new Int32Array(0);
  private ec = new Int32Array(0);
  private ed = new Float64Array(0);

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
    const w = stampValues(top, circuit.elements);
    this.base = w.base.slice();
    this.rhs0 = w.rhs0.slice();
    this.vals = new Float64Array(top.lu.nnz);
    this.b = new Float64Array(n);
    this.r = new Float64Array(n);
    this.dx = new Float64Array(n);
    this.y = new Float64Array(n);
    this.slot = new Int32Array(n).fill(-1);
    this.rows = new Int32Array(n);
    this.maxRank = Math.max(MAX_RANK_FLOOR, n / 2);
    const kmax = Math.floor(this.maxRank);
    this.kk = new Float64Array(kmax * kmax);
    this.my = new Float64Array(kmax);
    this.wv = new Float64Array(kmax);
    this.assembleAt(this.x0);
    this.vals0 = this.vals.slice();
    const fac = this.vals0.slice();
    const scale = new Float64Array(n);
    luColumnScale(this.vals0, top.lu, scale);
    if (luProgramFactor(fac, top.lu, scale, this.vals0)) {
      this.sparse = fac;
    } else {
      this.f0 = new Float64Array(n * n);
      luProgramToDense(this.vals0, top.lu, this.f0);
      this.ws = luWorkspace(n);
      if (luFactor(this.f0, this.ws) >= 0) throw new Error('the healthy Jacobian is singular');
    }
  }

  /** x = A₀⁻¹ b with the healthy factors. */
  private solveA0(b: Float64Array, x: Float64Array): void {
    if (this.sparse) luProgramSolve(this.sparse, this.top.lu, b, x);
    else luSolve(this.f0 as Float64Array, this.ws as LuWorkspace, b, x);
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
    const entries = this.stampEntries(stamps);
    const fast = entries && this.fast(entries);
    if (fast) return fast;
    const extra = stamps.map((s, i): Element => ({ kind: 'R', name: `fault#${i}`, part: 'fault', nodes: [s.a, s.b], value: 1 / s.dg }));
    const sol = solveNodes({ ...this.circuit, elements: [...this.circuit.elements, ...extra] }, { ...this.options, initialGuess: this.healthyGuess() });
    return { voltage: (node) => sol.voltage(node), nodes: () => sol.nodes(), method: 'full', iterations: 0 };
  }

  private healthyGuess(): Record<string, number> {
    const out: Record<string, number> = {};
    for (const [name, i] of this.top.nodeIndex) out[name] = this.x0[i] as number;
    return out;
  }

  /** Healthy Jacobian values and right-hand side linearised at x (into this.vals, this.b); true if pnjlim limited a junction. */
  private assembleAt(x: Float64Array): boolean {
    const { top } = this;
    const w = top.work;
    // the work arrays are the topology's, shared with every solve of the same structure: the junctions' device
    // parameters are written again; the linear stamps are this circuit's own copy (base, rhs0)
    if (this.nonlinear) stampValues(top, this.circuit.elements);
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
    w.asm.set(this.base);
    w.b.set(this.rhs0);
    const limited = this.nonlinear && stampJunctions(top, w, false);
    this.vals.set(w.asm.subarray(0, this.vals.length));
    this.b.set(w.b.subarray(0, top.n));
    return limited;
  }

  private zCol(r: number): Float64Array {
    let z = this.zCols.get(r);
    if (!z) {
      const e = new Float64Array(this.n);
      e[r] = 1;
      z = new Float64Array(this.n);
      this.solveA0(e, z);
      this.zCols.set(r, z);
    }
    return z;
  }

  /** The stamps as Jacobian entries (row, solution index, value), or undefined where the fast path does not apply. */
  private stampEntries(stamps: readonly RubberStamp[]): Entries | undefined {
    const { n, rowOfX } = this;
    const out: Entries = { row: [], col: [], d: [] };
    const put = (r: number, c: number, d: number) => {
      out.row.push(r);
      out.col.push(c);
      out.d.push(d);
    };
    for (const s of stamps) {
      const xa = s.a === '0' ? n : this.top.nodeIndex.get(s.a);
      const xb = s.b === '0' ? n : this.top.nodeIndex.get(s.b);
      if (xa === undefined || xb === undefined) return undefined;
      // a stamp on an island may give it a DC path: the faulted structure then has no GISLAND there (full solve)
      if (this.islands.has(xa) || this.islands.has(xb)) return undefined;
      const ra = xa < n ? (rowOfX[xa] as number) : -1;
      const rb = xb < n ? (rowOfX[xb] as number) : -1;
      if ((xa < n && ra < 0) || (xb < n && rb < 0)) return undefined;
      if (ra >= 0) put(ra, xa, s.dg);
      if (rb >= 0) put(rb, xb, s.dg);
      if (ra >= 0 && rb >= 0) {
        put(ra, xb, -s.dg);
        put(rb, xa, -s.dg);
      }
    }
    return out;
  }

  /**
   * Newton from the healthy solution, each step by Woodbury; undefined where the full solve must take over. The
   * step is solved in residual form (J Δ = J x − b), so the rounding of the Woodbury correction (large when a short
   * of a fraction of an ohm meets a 300 V bus) only perturbs the step: the next step corrects it, as iterative
   * refinement does (Golub & Van Loan, Matrix Computations, 4th ed., §3.5.3). A linear board takes two steps.
   */
  private fast(stamps: Entries): FaultSolution | undefined {
    const { n, top, vals, b, r, dx } = this;
    const { nnz, posRow, posCol } = top.lu;
    const x = this.x0.slice();
    const floor = this.stepFloor();
    for (let iter = 1; iter <= MAX_ITERATIONS; iter++) {
      // a step limited by pnjlim is not converged, however small (as newton.ts)
      const limited = this.assembleAt(x);
      for (let i = 0; i < n; i++) r[i] = -(b[i] as number);
      for (let t = 0; t < nnz; t++) {
        const ri = posRow[t] as number;
        r[ri] = (r[ri] as number) + (vals[t] as number) * (x[posCol[t] as number] as number);
      }
      for (let s = 0; s < stamps.d.length; s++) {
        const ri = stamps.row[s] as number;
        r[ri] = (r[ri] as number) + (stamps.d[s] as number) * (x[stamps.col[s] as number] as number);
      }
      if (!this.woodbury(stamps, r, dx)) return undefined;
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

  /** Solves (A₀ + D) · out = rhs with A₀'s factors and the Woodbury correction, D = the stamps plus this.vals − A₀. */
  private woodbury(stamps: Entries, rhs: Float64Array, out: Float64Array): boolean {
    const { n, vals, vals0, slot } = this;
    const { nnz, posRow, posCol } = this.top.lu;
    // the entries of D: the stamps, then the junction entries that moved (buffers kept: a build makes ~10⁵ steps)
    const cap = stamps.d.length + nnz;
    if (this.er.length < cap) {
      this.er = new Int32Array(cap);
      this.ec = new Int32Array(cap);
      this.ed = new Float64Array(cap);
    }
    const { er, ec, ed, rows } = this;
    let m = 0;
    for (let s = 0; s < stamps.d.length; s++, m++) {
      er[m] = stamps.row[s] as number;
      ec[m] = stamps.col[s] as number;
      ed[m] = stamps.d[s] as number;
    }
    for (let t = 0; t < nnz; t++) {
      const d = (vals[t] as number) - (vals0[t] as number);
      if (d === 0) continue;
      er[m] = posRow[t] as number;
      ec[m] = posCol[t] as number;
      ed[m++] = d;
    }
    let k = 0;
    for (let e = 0; e < m; e++) {
      const ri = er[e] as number;
      if (slot[ri] !== -1) continue;
      slot[ri] = k;
      rows[k++] = ri;
    }
    try {
      // k column solves (cached across faults) and a k×k system: beyond half the rows (and a small floor, where
      // everything is cheap) a refactorisation of the faulted matrix costs less
      if (k > this.maxRank) return false;
      this.solveA0(rhs, this.y);
      const y = this.y;
      if (k === 0) {
        out.set(y);
        return true;
      }
      const z = this.zs;
      for (let j = 0; j < k; j++) z[j] = this.zCol(rows[j] as number);
      // K = I + M Vᵀ Z (k×k), rhs = M Vᵀ y, with M Vᵀ = D's rows
      const kk = this.kk;
      const my = this.my;
      kk.fill(0, 0, k * k);
      my.fill(0, 0, k);
      for (let i = 0; i < k; i++) kk[i * k + i] = 1;
      for (let e = 0; e < m; e++) {
        const i = slot[er[e] as number] as number;
        const c = ec[e] as number;
        const d = ed[e] as number;
        my[i] = (my[i] as number) + d * (y[c] as number);
        const ro = i * k;
        for (let j = 0; j < k; j++) kk[ro + j] = (kk[ro + j] as number) + d * ((z[j] as Float64Array)[c] as number);
      }
      const ws = (this.kws[k] ??= luWorkspace(k));
      if (luFactor(kk, ws) >= 0) return false;
      const wv = this.wv;
      luSolve(kk, ws, my, wv);
      for (let i = 0; i < n; i++) {
        let s = y[i] as number;
        for (let j = 0; j < k; j++) s -= ((z[j] as Float64Array)[i] as number) * (wv[j] as number);
        out[i] = s;
      }
      return true;
    } finally {
      for (let j = 0; j < k; j++) slot[rows[j] as number] = -1;
    }
  }
}

/** Jacobian entries of a change: row, solution index (n is the reference: no column), value. */
interface Entries {
  row: number[];
  col: number[];
  d: number[];
}
