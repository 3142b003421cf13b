/**
 * Robustness corpus against ngspice (`pnpm bench:robustness [bases] [seed]`): the seeded netlists of bench/corpus.ts
 * (default 300 bases × 4 states = 1,200 decks) solved by ngspice (`.op`, batch driver of ngspice/batch.ts) and by
 * this package. Prints the convergence rate over the decks ngspice solves and the worst node-voltage error in units
 * of the tolerance max(1 mV, 0.1 %) (the acceptance of ngspice.test.ts).
 * ngspice runs twice, with its default tolerances and a thousand times tighter ones. Where the two answers differ by
 * more than the tolerance, ngspice's own answer depends on where its Newton loop stops (a node held only by
 * picoampere leakage against gigaohms): such a deck has no reference and is counted apart, not compared.
 * A deck this package solves to a different answer gets one more check of its reference (`conditioning`): ngspice
 * solves it again with every sub-ohm series resistance of its models (RS, RC, RE, RB, RBM) raised to 1 Ω. Where that
 * moves this package's answer by under a tenth of the tolerance (the resistors carry too little current to matter at
 * DC) but moves ngspice's answer by more than the tolerance, onto this package's, ngspice's first answer was set by
 * the rounding of its LU factors (a sub-ohm resistor in series with a junction that carries femtoamperes), not by the
 * circuit: such a deck has no reference either, and is counted apart and named.
 */
import { fileURLToPath } from 'node:url';
import { ngspiceBatch } from '../ngspice/batch';
import { ngspiceAvailable, ngspiceVersion } from '../ngspice/ngspice';
import { flatten, parseNetlist, solveOp } from '../src/index';
import { corpus, type CorpusCase } from './corpus';

export interface CaseOutcome {
  name: string;
  /** ngspice solved it with both tolerances to the same answer (the case counts). */
  reference: boolean;
  /** ngspice solved it, but its answer moved with its tolerances. */
  unstable?: boolean;
  /** ngspice's answer moved onto this package's when sub-ohm series resistances were raised to 1 Ω (see above). */
  illConditioned?: boolean;
  converged: boolean;
  /** Worst node error / tolerance (≤ 1 passes); the node. */
  worst: number;
  worstNode?: string;
  message?: string;
  ms: number;
}

/** Tolerance of a node voltage: max(1 mV, 0.1 % of ngspice's value). */
export const tolerance = (v: number): number => Math.max(1e-3, 1e-3 * Math.abs(v));

type Ref = Awaited<ReturnType<typeof ngspiceBatch>>[number];

/** Both ngspice answers converged and agree within the tolerance on every node. */
function stable(a: Ref, b: Ref): boolean {
  if (!a.converged || !b.converged) return false;
  return Object.entries(a.nodes).every(([k, v]) => b.nodes[k] !== undefined && Math.abs((b.nodes[k] as number) - v) <= tolerance(v));
}

/** Worst |a − b| over the nodes of b, in units of `share` × tolerance(b) (Infinity for a node a lacks). */
function worstError(a: Record<string, number>, b: Record<string, number>, share = 1): number {
  let worst = 0;
  for (const [node, v] of Object.entries(b)) {
    const got = a[node];
    worst = Math.max(worst, got === undefined ? Infinity : Math.abs(got - v) / (share * tolerance(v)));
  }
  return worst;
}

/** The deck with every model series resistance (RS, RC, RE, RB, RBM) below 1 Ω raised to 1 Ω. */
export function raiseSeriesResistances(deck: string): string {
  return deck.replace(/^\.model .*$/gim, (line) =>
    line.replace(/\b(RS|RC|RE|RB|RBM)=([0-9.eE+-]+)/gi, (all: string, name: string, value: string) => (Number(value) < 1 ? `${name}=1` : all)),
  );
}

function nodesOf(deck: string): Record<string, number> | undefined {
  try {
    const op = solveOp(flatten(parseNetlist(deck)));
    return op.converged ? op.nodes : undefined;
  } catch {
    return undefined;
  }
}

/** Marks the disagreements whose ngspice reference is set by rounding (see the header); they stop counting. */
async function conditioning(cases: readonly CorpusCase[], outcomes: CaseOutcome[], refs: readonly Ref[]): Promise<void> {
  const suspects = outcomes.flatMap((o, i) => (o.reference && o.converged && o.worst > 1 ? [i] : []));
  if (suspects.length === 0) return;
  const variants = suspects.map((i) => raiseSeriesResistances((cases[i] as CorpusCase).deck));
  const spice = await ngspiceBatch(variants);
  suspects.forEach((i, k) => {
    const mine = nodesOf((cases[i] as CorpusCase).deck);
    const moved = nodesOf(variants[k] as string);
    const ref = spice[k] as Ref;
    if (!mine || !moved || !ref.converged) return;
    const neutral = worstError(moved, mine, 0.1) <= 1;
    const refMoved = worstError(ref.nodes, (refs[i] as Ref).nodes) > 1;
    if (neutral && refMoved && worstError(mine, ref.nodes) <= 1) {
      outcomes[i] = { ...(outcomes[i] as CaseOutcome), reference: false, illConditioned: true };
    }
  });
}

export async function runCorpus(cases: readonly CorpusCase[]): Promise<CaseOutcome[]> {
  const decks = cases.map((c) => c.deck);
  const loose = await ngspiceBatch(decks, 2, '');
  const tight = await ngspiceBatch(decks);
  const outcomes = compare(cases, loose, tight);
  await conditioning(cases, outcomes, tight);
  return outcomes;
}

function compare(cases: readonly CorpusCase[], loose: readonly Ref[], tight: readonly Ref[]): CaseOutcome[] {
  return cases.map((c, i) => {
    const ok = stable(loose[i] as Ref, tight[i] as Ref);
    const ref: Ref = ok ? (tight[i] as Ref) : { converged: false, nodes: {}, sources: {} };
    const unstable = !ok && (loose[i] as Ref).converged;
    const t0 = performance.now();
    let op: ReturnType<typeof solveOp>;
    try {
      op = solveOp(flatten(parseNetlist(c.deck)));
    } catch (err) {
      return { name: c.name, reference: ref.converged, unstable, converged: false, worst: Infinity, message: (err as Error).message, ms: 0 };
    }
    const ms = performance.now() - t0;
    let worst = 0;
    let worstNode: string | undefined;
    if (op.converged && ref.converged) {
      for (const [node, v] of Object.entries(ref.nodes)) {
        const got = op.nodes[node];
        const e = got === undefined ? Infinity : Math.abs(got - v) / tolerance(v);
        if (e > worst) {
          worst = e;
          worstNode = node;
        }
      }
    }
    return { name: c.name, reference: ref.converged, unstable, converged: op.converged, worst, worstNode, message: op.message, ms };
  });
}

export interface Summary {
  cases: number;
  reference: number;
  converged: number;
  withinTolerance: number;
  worst: number;
  worstCase?: string;
}

export function summarise(outcomes: readonly CaseOutcome[]): Summary {
  const counted = outcomes.filter((o) => o.reference);
  let worst = 0;
  let worstCase: string | undefined;
  for (const o of counted) {
    const w = o.converged ? o.worst : Infinity;
    if (w > worst) {
      worst = w;
      worstCase = `${o.name}${o.worstNode ? ` node ${o.worstNode}` : ''}${o.converged ? '' : `: ${o.message ?? 'no convergence'}`}`;
    }
  }
  return {
    cases: outcomes.length,
    reference: counted.length,
    converged: counted.filter((o) => o.converged).length,
    withinTolerance: counted.filter((o) => o.converged && o.worst <= 1).length,
    worst,
    worstCase,
  };
}

async function main(): Promise<void> {
  if (!ngspiceAvailable()) {
    console.log('ngspice is not installed (Debian package "ngspice"): the robustness corpus needs it as the reference');
    process.exitCode = 1;
    return;
  }
  const bases = Number(process.argv[2] ?? 300);
  const seed = Number(process.argv[3] ?? 15);
  const cases = corpus(seed, bases);
  const t0 = performance.now();
  const outcomes = await runCorpus(cases);
  const s = summarise(outcomes);
  const kinds = [...new Set(cases.map((c) => c.kind))];
  console.log(`robustness corpus: ${s.cases} decks (${bases} circuits × 4 states, seed ${seed}) against ${ngspiceVersion()}`);
  for (const k of kinds) {
    const sub = summarise(outcomes.filter((o, i) => cases[i]?.kind === k));
    console.log(
      `  ${k.padEnd(10)} ${String(sub.converged).padStart(4)}/${String(sub.reference).padEnd(4)} converged, ${sub.withinTolerance} within tolerance, worst ${sub.worst.toFixed(3)}× tolerance`,
    );
  }
  const unstable = outcomes.filter((o) => o.unstable).length;
  const ill = outcomes.filter((o) => o.illConditioned).map((o) => o.name);
  console.log(
    `ngspice solved ${s.reference} of ${s.cases} to an answer that does not move with its tolerances (${unstable} more moved by over 1× tolerance between RELTOL 1e-3 and 1e-6: no reference, not counted)`,
  );
  console.log(
    `${ill.length} more had an ngspice answer set by rounding (it moved onto this package's with sub-ohm series resistances raised to 1 Ω): not counted${ill.length ? ` (${ill.join(', ')})` : ''}`,
  );
  console.log(`convergence: ${((100 * s.converged) / Math.max(1, s.reference)).toFixed(2)} % (${s.converged}/${s.reference} of the decks ngspice solves)`);
  console.log(
    `within max(1 mV, 0.1 %): ${s.withinTolerance}/${s.reference}; worst error ${s.worst.toFixed(3)}× tolerance${s.worstCase ? ` (${s.worstCase})` : ''}`,
  );
  const ours = outcomes.reduce((a, o) => a + o.ms, 0);
  console.log(`time: ${((performance.now() - t0) / 1000).toFixed(1)} s in all, ${ours.toFixed(0)} ms in this package's solves`);
  const bad = outcomes.filter((o) => o.reference && (!o.converged || o.worst > 1)).slice(0, 15);
  for (const o of bad) console.log(`  FAIL ${o.name}: ${o.converged ? `${o.worst.toFixed(2)}× at ${o.worstNode ?? '?'}` : (o.message ?? 'no convergence')}`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) void main();
