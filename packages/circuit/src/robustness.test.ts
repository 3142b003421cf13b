/**
 * A slice of the robustness corpus (bench/corpus.ts, 60 circuits × 4 states) against live ngspice 39: this package
 * converges on every deck ngspice solves, and every node is within max(1 mV, 0.1 %) of ngspice. A deck whose ngspice
 * answer is set by rounding (bench/robustness.ts `conditioning`) has no reference; they stay a rare exception. The
 * full 1,200-deck run is `pnpm bench:robustness`.
 */
import { describe, expect, it } from 'vitest';
import { corpus } from '../bench/corpus';
import { raiseSeriesResistances, runCorpus, summarise } from '../bench/robustness';
import { ngspiceAvailable } from '../ngspice/ngspice';

const available = ngspiceAvailable();

describe('robustness corpus vs ngspice', () => {
  it.skipIf(!available)(
    'converges on every deck ngspice solves, every node within max(1 mV, 0.1 %)',
    async () => {
      const outcomes = await runCorpus(corpus(2026, 60));
      const s = summarise(outcomes);
      expect(s.reference).toBeGreaterThan(200);
      const wrong = outcomes.filter((o) => o.reference && o.converged && o.worst > 1).map((o) => `${o.name}: ${o.worst.toFixed(2)}× at ${o.worstNode ?? '?'}`);
      expect(wrong).toEqual([]);
      const unsolved = outcomes.filter((o) => o.reference && !o.converged).map((o) => `${o.name}: ${o.message ?? ''}`);
      expect(unsolved).toEqual([]);
      const ill = outcomes.filter((o) => o.illConditioned).length;
      expect(ill).toBeLessThanOrEqual(Math.floor(0.01 * outcomes.length));
    },
    120_000,
  );

  it('raises only the sub-ohm series resistances of models, not elements or larger values', () => {
    const deck = ['t', '.model QP PNP(IS=1e-15 RC=0.1706 RE=0.02213 RB=10)', '.model DR D(IS=1e-12 RS=0.5)', 'RE1 a 0 0.5', '.op', '.end'].join('\n');
    expect(raiseSeriesResistances(deck).split('\n')).toEqual([
      't',
      '.model QP PNP(IS=1e-15 RC=1 RE=1 RB=10)',
      '.model DR D(IS=1e-12 RS=1)',
      'RE1 a 0 0.5',
      '.op',
      '.end',
    ]);
  });

  it.runIf(!available)('skipped: ngspice (Debian package "ngspice") is not installed, so there is no reference', () => {
    expect(available).toBe(false);
  });
});
