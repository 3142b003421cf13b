/**
 * Core rules of an honest diagnosis, on small invented systems:
 * - a prediction that could not be computed is left out of scoring and of probing (issue: a failed solve must
 *   never become an answer nor a "decisive" distinct outcome);
 * - the unmodelled-fault hypothesis takes the mass when nothing modelled fits (engine.ts header; the "unknown
 *   mode" of de Kleer & Williams 1989, "Diagnosis with behavioral modes", IJCAI — from memory);
 * - candidates from conflicts (de Kleer & Williams 1987, "Diagnosing multiple faults", AI 32; Reiter 1987,
 *   "A theory of diagnosis from first principles", AI 32: a diagnosis hits every conflict): a fault invisible
 *   alone is paired with the visible one although it is no strong single.
 */
import { describe, expect, it } from 'vitest';
import { diagnose, entropyBits, PredictionCache, testEntropy, activeSet, type Component, type SubFault, type SystemModel } from '../src/core/index.js';

const UNKNOWN = Number.NaN;
const gaussLL = (v: number, p: number) => -0.5 * ((v - p) / 0.1) ** 2 - Math.log(0.1 * Math.sqrt(2 * Math.PI));

/** A toy system: predictions from a table per fault set; NaN = the model could not compute it. */
function toy(
  components: Component[],
  table: (faults: readonly SubFault[], test: string) => number,
  extra: Partial<SystemModel<string, number, number>> = {},
): SystemModel<string, number, number> {
  return {
    components,
    predict: (faults, tests) => tests.map((t) => table(faults, t)),
    testKey: (t) => t,
    logLikelihood: (_t, v, p) => gaussLL(v, p),
    consistent: (_t, v, p) => Math.abs(v - p) < 0.5,
    outcomes: (_t, p) => [[String(p), 1]],
    predicted: (p) => !Number.isNaN(p),
    ...extra,
  };
}

const has = (faults: readonly SubFault[], c: string) => faults.some((f) => f.component === c);
const comp = (name: string, prior = 0.01): Component => ({ name, modes: [{ name: 'bad', prior }] });

describe('a prediction that could not be computed', () => {
  // A bad moves t1 to 5; B bad makes the model unsolvable for t1 and t3; t3 reads 7 on every solvable board.
  const model = toy([comp('A'), comp('B')], (f, t) => {
    if (t === 't1') return has(f, 'B') ? UNKNOWN : has(f, 'A') ? 5 : 1;
    if (t === 't3') return has(f, 'B') ? UNKNOWN : 7;
    return 0;
  });
  const post = diagnose(model, [{ test: 't1', value: 5 }]);
  const b = post.candidates.find((c) => c.faults.length === 1 && c.faults[0]?.part === 'B')!;

  it('is neutral evidence for that candidate and is listed as unpredicted, never scored as a value', () => {
    expect(b.unpredicted).toEqual([0]);
    expect(b.evidence[0]?.llr).toBeCloseTo(0, 12);
    expect(b.evidence[0]?.sign).toBe('neutral');
    expect(post.candidates[0]?.faults.map((f) => f.part)).toEqual(['A']);
  });

  it('tells nothing in probing: a test only the unsolvable candidate would "distinguish" gains nothing', () => {
    const active = activeSet(post);
    const h0 = entropyBits(active.map((a) => a.p));
    const { expectedEntropy } = testEntropy(model, new PredictionCache(model), active, 't3');
    expect(expectedEntropy).toBeCloseTo(h0, 12);
  });

  it('when the healthy system itself cannot be computed, the reading is excluded for every candidate', () => {
    const m2 = toy([comp('A')], () => UNKNOWN);
    const p2 = diagnose(m2, [{ test: 't1', value: 5 }]);
    expect(p2.excluded).toEqual([0]);
    for (const c of p2.candidates) expect(c.evidence[0]?.llr).toBe(0);
  });
});

describe('unmodelled fault', () => {
  const model = toy([comp('A')], (f) => (has(f, 'A') ? 5 : 1), { logLikelihoodBroad: () => -Math.log(100) });
  it('takes the mass when a reading is far from every prediction, and candidates are scaled down with it', () => {
    const post = diagnose(model, [{ test: 't1', value: 40 }], { unmodelledPrior: 0.05 });
    expect(post.unmodelled!.probability).toBeGreaterThan(0.9);
    const sum = post.candidates.reduce((a, c) => a + c.probability, 0);
    expect(sum + post.unmodelled!.probability).toBeCloseTo(1, 12);
  });
  it('stays small when a modelled candidate explains the reading', () => {
    const post = diagnose(model, [{ test: 't1', value: 5 }], { unmodelledPrior: 0.05 });
    expect(post.unmodelled!.probability).toBeLessThan(0.01);
    expect(post.candidates[0]?.faults[0]?.part).toBe('A');
  });
});

describe('candidates from conflicts', () => {
  // Rail r1 and source s2. C (a rail capacitor) short kills r1 but the switch S limits the current, so s2 holds;
  // S alone (C–E short on a conducting switch) changes nothing; C and S together pull s2 down as well.
  const fillers = Array.from({ length: 10 }, (_, i) => comp(`X${i}`, 0.02));
  const model = toy(
    [...fillers, comp('C', 0.004), comp('S', 0.003)],
    (f, t) => {
      const c = has(f, 'C');
      const s = has(f, 'S');
      if (t === 'r1') return c ? 0 : 15;
      if (t === 's2') return c && s ? 3 : 15;
      // Each filler moves its own test point only.
      const i = Number(t.slice(1));
      return has(f, `X${i}`) ? 9 : 1;
    },
    { suspects: (t) => (t === 'r1' ? ['C', 'S'] : t === 's2' ? ['S', 'X0'] : []) },
  );
  const readings = [
    { test: 'r1', value: 0 },
    { test: 's2', value: 3 },
  ];
  const pairOf = (post: ReturnType<typeof diagnose>) =>
    post.candidates.find(
      (c) =>
        c.faults
          .map((f) => f.part)
          .sort()
          .join('+') === 'C+S',
    );

  it('without conflicts the top-k rule never forms the masked pair (S is no strong single)', () => {
    const post = diagnose(model, readings, { pairTopK: 3, conflicts: false });
    expect(pairOf(post)).toBeUndefined();
  });
  it('with conflicts the pair C+S is generated, consistent, and first', () => {
    const post = diagnose(model, readings, { pairTopK: 3 });
    expect(post.generated.pairs).toBeGreaterThan(0);
    const pair = pairOf(post)!;
    expect(pair.consistent).toBe(true);
    expect(post.candidates[0]).toBe(pair);
    expect(post.minimalDiagnoses[0]).toEqual(['C', 'S']);
  });
});
