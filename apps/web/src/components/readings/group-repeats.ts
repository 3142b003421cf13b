import type { StoredReading } from '@splitscope/contract';

export interface ReadingGroup {
  /** Every reading of the same test in the same board state, oldest first (corrections and strikes included). */
  items: StoredReading[];
  /** The newest one that still counts, or the newest of all when none does. */
  latest: StoredReading;
  /** How many still count (not corrected, not struck). */
  current: number;
}

const key = (r: StoredReading) => [r.phase, r.mode, r.power, r.redNet.toLowerCase(), r.blackNet.toLowerCase(), [...r.lifted].sort().join(',')].join('|');

/** The same test taken again (same probes, meter function, power and lifted parts) as one group, in first-taken order. */
export function groupRepeats(readings: readonly StoredReading[]): ReadingGroup[] {
  const groups = new Map<string, StoredReading[]>();
  for (const r of readings) {
    const k = key(r);
    groups.set(k, [...(groups.get(k) ?? []), r]);
  }
  return [...groups.values()].map((items) => {
    const counting = items.filter((r) => r.supersededBy === null && r.struck === null);
    return { items, latest: counting.at(-1) ?? items.at(-1)!, current: counting.length };
  });
}
