/**
 * The shop's failure history as priors (electrical/history.ts): the Dirichlet–multinomial posterior mean with the
 * defaults as α pseudo-counts (Gelman et al., "Bayesian Data Analysis", 3rd ed., §3.4; from memory), checked by
 * hand on a small board, and on the demo fan drive: ten verified boards whose C8 shorted move C8 above its twins
 * C9 and C10 on readings that cannot tell them apart, and the output says why in the bench's words.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import {
  createDiagnoser,
  HISTORY_WEIGHT,
  historyAdjustments,
  type CaseReading,
  type Diagnoser,
  type DiagnosisOutput,
  type ElectricalPart,
} from '../src/index.js';
import { FAN_DRIVE_NETLIST, FAN_DRIVE_TEST_POINTS } from '../fixtures/fan-drive.js';

const part = (name: string, kind: ElectricalPart['kind'], modes: [string, number][]): ElectricalPart => ({
  name,
  kind,
  elements: [name.toLowerCase()],
  nets: [],
  modes: modes.map(
    ([m, prior]) => ({ name: m, prior, action: 'open', source: 'override', sweep: [], weights: [] }) as unknown as ElectricalPart['modes'][number],
  ),
});
const words = {
  board: (p: string, m: string, n: number, j: number) => `${p} ${m}: ${n} of ${j}`,
  kind: (p: string, m: string, k: string, n: number, j: number) => `${k} ${m}: ${n} of ${j}`,
};

describe('history adjustments by hand', () => {
  const parts = [
    part('C1', 'electrolytic-capacitor', [
      ['short', 0.02],
      ['open', 0.02],
    ]),
    part('R1', 'resistor', [['open', 0.01]]),
  ];
  const byName = (k: string) => (k === 'C1' || k === 'R1' ? k : undefined);

  it('posterior mean (α q + n) / (α + N) per mode, the total fault prior kept', () => {
    const adj = historyAdjustments(parts, { board: { jobs: 5, failures: [{ key: 'C1', mode: 'short', count: 5 }] } }, byName, words);
    const total = 0.05;
    const q = 0.02 / total;
    const share = (HISTORY_WEIGHT * q + 5) / (HISTORY_WEIGHT + 5);
    const c1Short = adj.find((a) => a.part === 'C1' && a.mode === 'short');
    expect(c1Short?.prior).toBeCloseTo(total * share, 12);
    expect(c1Short?.note).toBe('C1 short: 5 of 5');
    const r1 = adj.find((a) => a.part === 'R1');
    expect(r1?.prior).toBeCloseTo(0.01 * (HISTORY_WEIGHT / (HISTORY_WEIGHT + 5)), 12);
    expect(r1?.note).toBeUndefined();
    const sum = adj.reduce((s, a) => s + (a.prior ?? 0), 0);
    expect(sum).toBeCloseTo(total, 12);
  });

  it('a failure without a mode is spread over the part modes by their priors; unknown parts are skipped', () => {
    const adj = historyAdjustments(
      parts,
      {
        board: {
          jobs: 2,
          failures: [
            { key: 'C1', count: 2 },
            { key: 'Q9', count: 1 },
          ],
        },
      },
      byName,
      words,
    );
    expect(adj.find((a) => a.mode === 'short')?.note).toBe('C1 short: 1 of 2');
    expect(adj.find((a) => a.mode === 'open' && a.part === 'C1')?.prior).toBeCloseTo(adj.find((a) => a.mode === 'short')?.prior as number, 12);
  });

  it('kind history from other models is a factor on every part of that kind and mode', () => {
    const adj = historyAdjustments(parts, { kinds: { jobs: 8, failures: [{ key: 'electrolytic-capacitor', mode: 'short', count: 8 }] } }, byName, words);
    expect(adj).toHaveLength(1);
    expect(adj[0]).toMatchObject({ part: 'C1', mode: 'short', source: 'history-kind' });
    expect(adj[0]?.factor).toBeGreaterThan(1);
  });
});

describe('ten verified boards with C8 shorted, on the demo fan drive', () => {
  // Dead switched fan rail with a healthy 15 V source: a short on any of the rail's filter capacitors explains it.
  const dead: CaseReading[] = [
    { mode: 'dcv', red: 'v15', black: '0', power: 'on', value: 14.98 },
    { mode: 'dcv', red: 'vfan', black: '0', power: 'on', value: 0.05 },
    { mode: 'continuity', red: 'vfan', black: '0', power: 'off', value: true },
  ];
  let d: Diagnoser;
  let plain: DiagnosisOutput;
  let learned: DiagnosisOutput;
  const rank = (o: DiagnosisOutput, p: string) => o.parts.findIndex((x) => x.part === p && x.mode === 'short');
  const prob = (o: DiagnosisOutput, p: string) => o.parts.find((x) => x.part === p && x.mode === 'short')?.probability ?? 0;

  beforeAll(() => {
    d = createDiagnoser({ netlist: FAN_DRIVE_NETLIST, testPoints: FAN_DRIVE_TEST_POINTS });
    plain = d.update(dead);
    learned = d.update(dead, { history: { board: { jobs: 10, failures: [{ key: 'C8', mode: 'short', count: 10 }] } } });
  }, 240_000);

  it('C8 moves to the top of the ranking, above the capacitors the readings cannot tell from it (C9, C10)', () => {
    expect(rank(plain, 'C8')).toBeGreaterThan(0);
    expect(rank(learned, 'C8')).toBe(0);
    expect(prob(learned, 'C8')).toBeGreaterThan(Math.max(prob(learned, 'C9'), prob(learned, 'C10')));
    expect(prob(learned, 'C8') / prob(plain, 'C8')).toBeGreaterThan(3);
  });

  it('says why, in the bench words, with how many jobs back it', () => {
    const c8 = learned.priors.find((p) => p.part === 'C8' && p.mode === 'short');
    expect(c8?.steps[0]?.source).toBe('history');
    expect(c8?.steps[0]?.note).toBe('C8 capacitor — shorted: 10 of the last 10 verified boards of this model');
    expect(c8?.after).toBeGreaterThan(c8?.before as number);
    expect(plain.priors).toEqual([]);
  });
});
