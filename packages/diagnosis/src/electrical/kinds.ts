/**
 * Default fault modes and priors per part kind — the one table.
 *
 * Priors are per part, per repair job (the chance that a part on a board that came in for repair is in that
 * mode). They are rough figures for ranking, not field statistics; each is marked "common practice" (a trade
 * rule of thumb) or "from memory". A board model or a case's `parts` entry may override the kind and the
 * prior of any mode per part.
 *
 * Real faults are not ideal, so each parameterised mode is a finite sweep and the prior is split evenly among
 * its points (the likelihood of a candidate is the sum over the points):
 * - `short`: a shorted ceramic capacitor reads a fraction of an ohm to a few ohms (common practice), so the
 *   sweep runs 0.1 Ω … 30 Ω, and the rail it kills sits at some millivolts to a few hundred, not at zero. Capacitors
 *   and diodes share one grid (SHORT_GRID): a capacitor across a zener or a clamp diode is its twin at DC, and a
 *   sweep is a quadrature of the unknown short's resistance; on different grids a short between two points fits the
 *   twin whose grid lies nearer, and the grid, not the evidence, picks the part (the marginal likelihood of a
 *   parameterised model, MacKay, "Information Theory, Inference, and Learning Algorithms", 2003, ch. 28; from memory).
 * - `open`: a very high resistance (1 MΩ … 1 GΩ), not a missing element: cracked films and lifted joints leak.
 * - `drift`: a multiplier on the value (×0.5 … ×10); carbon and metal-film resistors under stress mostly go
 *   high (common practice), so the sweep is weighted towards ×2 … ×10.
 * - `leaky`: a capacitor with a parallel resistance of hundreds of ohms to tens of kilohms.
 *
 * An open capacitor is invisible to DC meter readings (it is already open at DC), so it has no mode here:
 * it would only duplicate the no-fault candidate — except the bulk capacitor of a rectified bus, where a DC
 * voltmeter still sees the symptom (BULK_MODES, behavioural).
 */

export type PartKind =
  'resistor' | 'ceramic-capacitor' | 'electrolytic-capacitor' | 'inductor' | 'diode' | 'led' | 'bjt' | 'opto-coupler' | 'regulator' | 'subcircuit' | 'source';

export const PART_KINDS: readonly PartKind[] = [
  'resistor',
  'ceramic-capacitor',
  'electrolytic-capacitor',
  'inductor',
  'diode',
  'led',
  'bjt',
  'opto-coupler',
  'regulator',
  'subcircuit',
  'source',
];

/**
 * How a mode rewrites the element it applies to (see faults.ts):
 * - `short`: the element is replaced by a resistor of `value` ohms between its two nodes.
 * - `open`: the element is replaced by a resistor of `value` ohms (very high).
 * - `scale`: the element's value (or gain) is multiplied by `value`.
 * - `parallel`: a resistor of `value` ohms is added across the element (leaky capacitor).
 * - `ce-short` / `be-short`: a resistor of `value` ohms across collector–emitter / base–emitter.
 * - `be-open` / `bc-open`: the transistor is replaced by its other junction alone (a diode).
 * - `dead` / `out-short` / `in-out-short`: regulator modes on the instance's ports.
 * - `current-limit`: a resistor of `value` ohms in series with the regulator's output (behavioural: a regulator
 *   in current limit or foldback lets its output sag with the load).
 * - `source-scale`: the board's rectified-bus source is multiplied by `value` (behavioural: bulk capacitor open
 *   or dried out, see BULK_MODES).
 */
export type FaultAction =
  | 'short'
  | 'open'
  | 'scale'
  | 'parallel'
  | 'ce-short'
  | 'be-short'
  | 'be-open'
  | 'bc-open'
  | 'dead'
  | 'out-short'
  | 'in-out-short'
  | 'current-limit'
  | 'source-scale';

export interface ModeTemplate {
  name: string;
  action: FaultAction;
  prior: number;
  /** Where the prior comes from. */
  source: 'common practice' | 'from memory';
  /** Sweep values (ohms for short/open/parallel, multiplier for scale); absent = fixed mode. */
  sweep?: readonly number[];
  /** Relative weights of the sweep points (default even). */
  weights?: readonly number[];
}

const SHORT_GRID = [0.1, 0.3, 1, 3, 10, 30];
const OPEN = [1e6, 1e7, 1e8, 1e9];

export const DEFAULT_MODES: Readonly<Record<PartKind, readonly ModeTemplate[]>> = {
  resistor: [
    // Resistors mostly fail open or drift high, rarely short (common practice).
    { name: 'open', action: 'open', prior: 0.003, source: 'common practice', sweep: OPEN },
    { name: 'drift', action: 'scale', prior: 0.003, source: 'from memory', sweep: [0.5, 2, 5, 10], weights: [1, 2, 2, 2] },
    { name: 'short', action: 'short', prior: 0.0002, source: 'from memory', sweep: [0.1, 1, 10] },
  ],
  'ceramic-capacitor': [
    // Multilayer ceramics on supply rails fail short after cracking (common practice).
    { name: 'short', action: 'short', prior: 0.004, source: 'common practice', sweep: SHORT_GRID },
    { name: 'leaky', action: 'parallel', prior: 0.001, source: 'from memory', sweep: [300, 3e3, 30e3] },
  ],
  'electrolytic-capacitor': [
    // Electrolytics mostly lose capacitance (invisible at DC); a hard short is rarer than on ceramics (from memory).
    { name: 'short', action: 'short', prior: 0.002, source: 'from memory', sweep: SHORT_GRID },
    { name: 'leaky', action: 'parallel', prior: 0.003, source: 'from memory', sweep: [200, 2e3, 20e3] },
  ],
  inductor: [{ name: 'open', action: 'open', prior: 0.001, source: 'from memory', sweep: [1e6, 1e9] }],
  diode: [
    // Rectifier and clamp diodes fail short more often than open (common practice).
    { name: 'short', action: 'short', prior: 0.004, source: 'common practice', sweep: SHORT_GRID },
    { name: 'open', action: 'open', prior: 0.002, source: 'from memory', sweep: [1e7, 1e9] },
  ],
  led: [
    { name: 'open', action: 'open', prior: 0.004, source: 'from memory', sweep: [1e7, 1e9] },
    { name: 'short', action: 'short', prior: 0.001, source: 'from memory', sweep: [5, 50] },
  ],
  bjt: [
    // A switching transistor that took an overload usually ends collector–emitter short (common practice).
    { name: 'ce-short', action: 'ce-short', prior: 0.003, source: 'common practice', sweep: [1, 10, 100] },
    { name: 'be-open', action: 'be-open', prior: 0.002, source: 'from memory' },
    { name: 'bc-open', action: 'bc-open', prior: 0.001, source: 'from memory' },
    { name: 'be-short', action: 'be-short', prior: 0.001, source: 'from memory', sweep: [1, 10] },
  ],
  // Opto-couplers and generic subcircuits take their internal elements' modes (`dl:open`, `q1:ce-short`); the
  // internal element's own kind gives the template. The opto's LED wears out first (common practice), so its
  // LED modes are scaled up; see OPTO_LED_FACTOR.
  'opto-coupler': [],
  subcircuit: [],
  regulator: [
    { name: 'dead', action: 'dead', prior: 0.004, source: 'from memory' },
    { name: 'out-short', action: 'out-short', prior: 0.001, source: 'from memory', sweep: [1, 10] },
    { name: 'in-out-short', action: 'in-out-short', prior: 0.001, source: 'from memory', sweep: [1, 10] },
    // Behavioural: output sags under load (current limit / foldback at a fraction of its rating).
    { name: 'current-limit', action: 'current-limit', prior: 0.001, source: 'from memory', sweep: [100, 1e3, 1e4] },
  ],
  // Independent sources stand for the supply and the controller's outputs: not repairable parts.
  source: [],
};

/**
 * Internal current-controlled sources (an opto's current transfer): output gone or CTR degraded. The CTR sweep
 * multiplies the model's transfer: PC817 (Sharp datasheet [read]) guarantees CTR 50–600 % at 5 mA (rank A
 * 80–160 %), so ×0.3 takes a mid-rank part to the datasheet minimum and ×0.1, ×0.02 well below it — what an aged
 * LED (the usual wear-out, common practice) gives.
 */
export const TRANSFER_MODES: readonly ModeTemplate[] = [
  { name: 'open', action: 'scale', prior: 0.001, source: 'from memory', sweep: [0] },
  { name: 'drift', action: 'scale', prior: 0.002, source: 'from memory', sweep: [0.3, 0.1, 0.02] },
];

/**
 * Behavioural modes of the bulk electrolytic capacitor on a rectified bus (hazard.ts finds the bus and its
 * source). Open: the bus is the unsmoothed full-wave rectified sine, whose DC mean is 2/π of the peak
 * (2√2/π·Vrms; any circuits textbook): 230 V rms → 207 V instead of ~325 V; swept ±5 % about 2/π because the
 * shop's mains differs from the model's nominal. Dried out (capacitance lost): the
 * mean sits between, lower by about half the ripple ΔV ≈ I/(2fC) (see the references file, [computed]), so a
 * sweep of the peak fraction; the points are from memory. Electrolytics lose capacitance far more often than they
 * short (common practice), hence the priors.
 */
export const BULK_MODES: readonly ModeTemplate[] = [
  { name: 'open', action: 'source-scale', prior: 0.002, source: 'common practice', sweep: [0.95, 1, 1.05].map((k) => (2 / Math.PI) * k) },
  { name: 'dried-out', action: 'source-scale', prior: 0.003, source: 'common practice', sweep: [0.75, 0.85, 0.93] },
];

/** LED degradation dominates opto-coupler failures (common practice): internal diode priors × this. */
export const OPTO_LED_FACTOR = 2;

/** Electrolytic when a capacitor is at least this large and no kind is given (common practice). */
export const ELECTROLYTIC_THRESHOLD = 1e-6;
