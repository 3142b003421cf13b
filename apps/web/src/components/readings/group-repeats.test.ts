import { describe, expect, it } from 'vitest';
import type { StoredReading } from '@splitscope/contract';
import { groupRepeats } from './group-repeats';

const r = (id: string, over: Partial<StoredReading> = {}): StoredReading =>
  ({
    id,
    jobId: 'j',
    mode: 'ohm',
    red: 'TP5',
    black: '0',
    redNet: 'vfan',
    blackNet: '0',
    power: 'off',
    lifted: [],
    value: 1300,
    unit: 'ohm',
    beep: null,
    raw: '1.3k',
    instrument: null,
    phase: 'diagnosis',
    idempotencyKey: id,
    supersedes: null,
    supersededBy: null,
    authorId: 'u',
    authorName: 'Tech',
    takenAt: '2026-12-05T10:00:00Z',
    createdAt: '2026-12-05T10:00:00Z',
    verdict: null,
    safetyBusVolts: 2,
    struck: null,
    ...over,
  }) as StoredReading;

describe('repeats', () => {
  it('lists the same test in the same board state once with its values, and apart when a part is lifted', () => {
    const groups = groupRepeats([
      r('a'),
      r('b', { red: 'vfan' }),
      r('c', { lifted: ['C10'] }),
      r('d', { struck: { reason: 'slipped', authorName: 'Tech', at: '2026-12-05T10:01:00Z' } }),
    ]);
    expect(groups.map((g) => g.items.map((x) => x.id))).toEqual([['a', 'b', 'd'], ['c']]);
    expect(groups[0]!.current).toBe(2);
    expect(groups[0]!.latest.id).toBe('b');
  });
});
