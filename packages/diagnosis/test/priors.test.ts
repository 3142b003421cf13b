/**
 * Per-job prior adjustments (core/priors.ts): the odds form of Bayes' rule for a factor, replacement for a prior,
 * the part keeps an "ok" mode, the same engine (no rebuild, its prediction cache kept) answers with and without,
 * and the output names which source moved which prior.
 */
import { describe, expect, it } from 'vitest';
import { adjustComponents, diagnose, oddsUpdate, PredictionCache, MAX_FAULT_SUM, type Component, type SubFault, type SystemModel } from '../src/core/index.js';

const gaussLL = (v: number, p: number) => -0.5 * ((v - p) / 0.1) ** 2 - Math.log(0.1 * Math.sqrt(2 * Math.PI));
const has = (faults: readonly SubFault[], c: string) => faults.some((f) => f.component === c);

// A and B both pull t1 from 1 to 5 (the reading cannot tell them apart); C has two modes.
const components: Component[] = [
  { name: 'A', modes: [{ name: 'short', prior: 0.01 }] },
  { name: 'B', modes: [{ name: 'short', prior: 0.01 }] },
  {
    name: 'C',
    modes: [
      { name: 'open', prior: 0.02 },
      { name: 'short', prior: 0.01 },
    ],
  },
];
let predictions = 0;
const model: SystemModel<string, number, number> = {
  components,
  predict: (faults, tests) => {
    predictions += tests.length;
    return tests.map(() => (has(faults, 'A') || has(faults, 'B') ? 5 : 1));
  },
  testKey: (t) => t,
  logLikelihood: (_t, v, p) => gaussLL(v, p),
  consistent: (_t, v, p) => Math.abs(v - p) < 0.5,
  outcomes: (_t, p) => [[String(p), 1]],
};
const share = (post: ReturnType<typeof diagnose>, part: string) => post.parts.filter((p) => p.part === part).reduce((s, p) => s + p.probability, 0);

describe('prior adjustments', () => {
  it('a factor is a likelihood ratio on the odds (Bayes odds form)', () => {
    expect(oddsUpdate(0.5, 3)).toBeCloseTo(0.75, 12); // odds 1 → 3
    expect(oddsUpdate(0.01, 10)).toBeCloseTo((10 * 0.01) / (0.99 + 0.1), 12);
    expect(oddsUpdate(0.2, 1)).toBe(0.2);
    expect(oddsUpdate(0, 50)).toBe(0);
  });

  it('factor, replacement and a part-wide step, each reported with its source', () => {
    const { components: out, changes } = adjustComponents(components, [
      { part: 'C', factor: 4, source: 'fault-code', note: 'code E1 points at the switch' },
      { part: 'C', mode: 'open', prior: 0.05, source: 'history', note: '3 of 5 boards' },
    ]);
    const c = out.find((x) => x.name === 'C') as Component;
    expect(c.modes.find((m) => m.name === 'open')?.prior).toBe(0.05);
    expect(c.modes.find((m) => m.name === 'short')?.prior).toBeCloseTo(oddsUpdate(0.01, 4), 12);
    // Untouched parts are the same objects.
    expect(out[0]).toBe(components[0]);
    const open = changes.find((x) => x.part === 'C' && x.mode === 'open');
    expect(open?.before).toBe(0.02);
    expect(open?.steps.map((s) => s.source)).toEqual(['fault-code', 'history']);
    expect(open?.steps[0]?.after).toBeCloseTo(oddsUpdate(0.02, 4), 12);
  });

  it('a part keeps an ok mode however large the factors', () => {
    const { components: out } = adjustComponents(components, [{ part: 'C', factor: 1e6, source: 'test' }]);
    const sum = (out[2] as Component).modes.reduce((s, m) => s + m.prior, 0);
    expect(sum).toBeCloseTo(MAX_FAULT_SUM, 9);
  });

  it('refuses an unknown part or mode, and a step with both or neither of factor and prior', () => {
    expect(() => adjustComponents(components, [{ part: 'Z', factor: 2, source: 's' }])).toThrow(/unknown part Z/);
    expect(() => adjustComponents(components, [{ part: 'A', mode: 'open', factor: 2, source: 's' }])).toThrow(/no mode open/);
    expect(() => adjustComponents(components, [{ part: 'A', source: 's' }])).toThrow(/exactly one/);
    expect(() => adjustComponents(components, [{ part: 'A', factor: -1, source: 's' }])).toThrow(/positive/);
  });

  it('moves the ranking of two parts the readings cannot tell apart, on the same engine and cache', () => {
    const cache = new PredictionCache(model);
    const obs = [{ test: 't1', value: 5 }];
    const plain = diagnose(model, obs, {}, cache);
    expect(share(plain, 'A')).toBeCloseTo(share(plain, 'B'), 6);
    const before = predictions;
    const steered = diagnose(model, obs, { priors: [{ part: 'B', factor: 9, source: 'history' }] }, cache);
    // Nothing was predicted again: the adjustment changes prior terms only.
    expect(predictions).toBe(before);
    expect(steered.parts[0]?.part).toBe('B');
    // The likelihoods are equal, so the marginals' ratio is that of the priors: with r = p / (1 − p) and the pair
    // A+B counted in both and the pairs with C's modes (rC, no triples on 3 parts), share(B) / share(A) =
    // rB (1 + rA + rC) / (rA (1 + rB + rC)).
    const rA = 0.01 / 0.99;
    const rC = 0.03 / 0.97;
    const pB = oddsUpdate(0.01, 9);
    const rB = pB / (1 - pB);
    const expected = (rB * (1 + rA + rC)) / (rA * (1 + rB + rC));
    expect(share(steered, 'B') / share(steered, 'A')).toBeCloseTo(expected, 2);
    expect(steered.priorChanges?.map((c) => [c.part, c.mode, c.steps[0]?.source])).toEqual([['B', 'short', 'history']]);
    // And back: without adjustments the answer is the plain one.
    expect(share(diagnose(model, obs, {}, cache), 'B')).toBeCloseTo(share(plain, 'B'), 12);
  });
});
