/**
 * The polybox of de Kleer & Williams 1987, "Diagnosing multiple faults", Artificial Intelligence 32:
 * M1 X=A·C, M2 Y=B·D, M3 Z=C·E, A1 F=X+Y, A2 G=Y+Z; A=3, B=2, C=2, D=3, E=3; observed F=10, G=12.
 * Each component has an `unknown output` mode, modelled as a finite sweep of its output over 0..24
 * (wide enough to hold every value the example needs). The paper's minimal diagnoses are
 * {A1}, {M1}, {M2, A2}, {M2, M3}.
 */
import { describe, expect, it } from 'vitest';
import {
  diagnose,
  PredictionCache,
  rankTests,
  testEntropy,
  type Component,
  type Observation,
  type Posterior,
  type SubFault,
  type SystemModel,
} from '../src/core/index.js';

type Signal = 'X' | 'Y' | 'Z' | 'F' | 'G';
const NAMES = ['M1', 'M2', 'M3', 'A1', 'A2'] as const;
const SWEEP = Array.from({ length: 25 }, (_, v) => ({ value: v, weight: 1 / 25 }));

function polybox(p: number): SystemModel<Signal, number, number> {
  const components: Component[] = NAMES.map((name) => ({ name, modes: [{ name: 'unknown', prior: p, points: SWEEP }] }));
  const eval1 = (faults: readonly SubFault[]): Record<Signal, number> => {
    const out = (c: string, v: number) => faults.find((f) => f.component === c)?.value ?? v;
    const [A, B, C, D, E] = [3, 2, 2, 3, 3];
    const X = out('M1', A * C);
    const Y = out('M2', B * D);
    const Z = out('M3', C * E);
    return { X, Y, Z, F: out('A1', X + Y), G: out('A2', Y + Z) };
  };
  return {
    components,
    predict: (faults, tests) => {
      const s = eval1(faults);
      return tests.map((t) => s[t]);
    },
    testKey: (t) => t,
    // Exact integer arithmetic: a narrow Gaussian (sigma 0.1) as the noise model.
    logLikelihood: (_t, v, pred) => -0.5 * ((v - pred) / 0.1) ** 2 - Math.log(0.1 * Math.sqrt(2 * Math.PI)),
    consistent: (_t, v, pred) => Math.abs(v - pred) < 0.5,
    outcomes: (_t, pred) => [[String(pred), 1]],
  };
}

const readings: Observation<Signal, number>[] = [
  { test: 'F', value: 10 },
  { test: 'G', value: 12 },
];

describe('polybox (de Kleer & Williams 1987)', () => {
  it('gives exactly the minimal diagnoses {A1}, {M1}, {M2, A2}, {M2, M3}', () => {
    const post = diagnose(polybox(0.01), readings);
    expect(post.pairRule).toBe('all');
    const sets = post.minimalDiagnoses.map((s) => s.join(',')).sort();
    expect(sets).toEqual(['A1', 'M1', 'M2,A2', 'M2,M3'].map((s) => s.split(',').sort().join(',')).sort());
  });

  it('the healthy system is inconsistent and the single faults M2, M3, A2 are ruled out', () => {
    const post = diagnose(polybox(0.01), readings);
    const find = (names: string[]) =>
      post.candidates.find(
        (c) =>
          c.faults
            .map((f) => f.part)
            .sort()
            .join() === names.sort().join(),
      );
    expect(find([])?.consistent).toBe(false);
    expect(find(['M2'])?.consistent).toBe(false);
    expect(find(['M3'])?.consistent).toBe(false);
    expect(find(['A2'])?.consistent).toBe(false);
    expect(find(['M1'])?.consistent).toBe(true);
    // M1 and A1 are the likeliest and equally likely.
    const top = post.candidates
      .slice(0, 2)
      .map((c) => c.faults[0]?.part)
      .sort();
    expect(top).toEqual(['A1', 'M1']);
    expect(post.candidates[0]?.probability).toBeCloseTo(post.candidates[1]?.probability ?? 0, 9);
    // Under M1 the readings force X = 4.
    const m1 = find(['M1']);
    const best = m1?.combos.reduce((a, b) => (a.weight > b.weight ? a : b));
    expect(best?.faults[0]?.value).toBe(4);
    expect(best?.weight).toBeGreaterThan(0.999);
    // Evidence: G=12 speaks against no fault... and F=10 supports M1 versus the healthy system.
    expect(m1?.evidence[0]?.sign).toBe('supports');
  });

  it('with p = 0.01 over the minimal candidates, X has the highest outcome entropy (≈1.00 bit; Y ≈ 0.08, Z ≈ 0.05)', () => {
    // Values computed by hand from the paper's method: candidate weights p^|D| (1-p)^(5-|D|) over the
    // four minimal diagnoses give P({A1}) = P({M1}) = 0.495, P({M2,A2}) = P({M2,M3}) = 0.005.
    // X = 4 only under {M1}: H(0.495) ≈ 1.000; Y = 4 under both pairs: H(0.01) ≈ 0.081;
    // Z = 8 only under {M2,M3}: H(0.005) ≈ 0.045.
    const p = 0.01;
    const model = polybox(p);
    const post = diagnose(model, readings);
    const minimal = new Set(post.minimalDiagnoses.map((s) => [...s].sort().join()));
    const kept = post.candidates.filter((c) =>
      minimal.has(
        c.faults
          .map((f) => f.part)
          .sort()
          .join(),
      ),
    );
    const weights = kept.map((c) => p ** c.faults.length * (1 - p) ** (5 - c.faults.length));
    const z = weights.reduce((a, b) => a + b, 0);
    const restricted: Posterior = { ...post, candidates: kept.map((c, i) => ({ ...c, probability: (weights[i] as number) / z })) };
    const cache = new PredictionCache(model);
    const active = restricted.candidates.map((c) => ({
      cand: c,
      p: c.probability,
      combos: c.combos.filter((k) => k.weight > 1e-6).map((k) => ({ faults: k.faults, w: k.weight })),
    }));
    const h = (t: Signal) => testEntropy(model, cache, active, t).outcomeEntropy;
    expect(h('X')).toBeCloseTo(1.0, 2);
    expect(h('Y')).toBeCloseTo(0.08, 2);
    expect(h('Z')).toBeCloseTo(0.05, 2);
    const ranked = rankTests(model, restricted, ['X', 'Y', 'Z'] as Signal[], () => 1, { maxCandidates: 100, massCutoff: 1 }, cache);
    expect(ranked.map((r) => r.test)).toEqual(['X', 'Y', 'Z']);
    // Deterministic outcomes: expected posterior entropy = H(C) - H(O).
    const hc = -restricted.candidates.reduce((a, c) => a + c.probability * Math.log2(c.probability), 0);
    expect(ranked[0]?.expectedEntropy).toBeCloseTo(hc - h('X'), 9);
  });

  it('on the full posterior (all singles and pairs) the first probe is still X', () => {
    const model = polybox(0.01);
    const post = diagnose(model, readings);
    const ranked = rankTests(model, post, ['X', 'Y', 'Z'], () => 1);
    expect(ranked[0]?.test).toBe('X');
    expect(ranked[0]?.gain).toBeGreaterThan(0.9);
  });

  it('costs weigh the ranking: an expensive X loses to a cheap Y', () => {
    const model = polybox(0.01);
    const post = diagnose(model, readings);
    const ranked = rankTests(model, post, ['X', 'Y'], (t) => (t === 'X' ? 1000 : 1));
    expect(ranked[0]?.test).toBe('Y');
  });
});
