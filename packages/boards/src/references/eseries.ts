/**
 * IEC 60063 preferred-number series. E6/E12/E24 are hard-coded (E24 departs from the rounded formula at 27, 30, 33,
 * 36, 39, 43, 47 and 82); E48/E96 follow round(100·10^(i/n)), which matches the published tables.
 * Tables checked against a published E-series library's tables (not the IEC text itself).
 */

export const E6 = [10, 15, 22, 33, 47, 68] as const;
export const E12 = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82] as const;
export const E24 = [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91] as const;

function threeDigit(n: number): number[] {
  return Array.from({ length: n }, (_, i) => Math.round(100 * 10 ** (i / n)));
}
export const E48: readonly number[] = threeDigit(48);
export const E96: readonly number[] = threeDigit(96);

export type SeriesName = 'E6' | 'E12' | 'E24' | 'E48' | 'E96';
export const SERIES: Record<SeriesName, readonly number[]> = { E6, E12, E24, E48, E96 };
/** Usual tolerance of each series (IEC 60063). */
export const SERIES_TOLERANCE: Record<SeriesName, number> = { E6: 0.2, E12: 0.1, E24: 0.05, E48: 0.02, E96: 0.01 };

export interface NearestValue {
  value: number;
  series: SeriesName;
  /** Relative deviation of the asked value from the chosen preferred value, (asked − value)/value. */
  deviation: number;
  below: number;
  above: number;
}

/** The preferred value nearest (by ratio) to `value` in the series, with its neighbours. */
export function nearestPreferred(value: number, series: SeriesName = 'E24'): NearestValue {
  if (!Number.isFinite(value) || value <= 0) throw new RangeError(`value must be a positive number, got ${value}`);
  const table = SERIES[series];
  const mant = table[0] === 10 ? 10 : 100; // two-digit tables start at 10, three-digit at 100
  const decade = Math.floor(Math.log10(value / mant) + 1e-12);
  const scale = 10 ** decade;
  const cands: number[] = [];
  for (const d of [-1, 0, 1]) for (const t of table) cands.push(t * scale * 10 ** d);
  cands.sort((a, b) => a - b);
  let best = cands[0] as number;
  for (const c of cands) if (Math.abs(Math.log(value / c)) < Math.abs(Math.log(value / best))) best = c;
  const idx = cands.indexOf(best);
  const clean = (x: number) => Number(x.toPrecision(6));
  return {
    value: clean(best),
    series,
    deviation: (value - best) / best,
    below: clean(cands[Math.max(0, idx - 1)] as number),
    above: clean(cands[Math.min(cands.length - 1, idx + 1)] as number),
  };
}

/** Whether `value` (any decade) is a member of the series, within 0.1 %. */
export function isPreferred(value: number, series: SeriesName = 'E24'): boolean {
  const n = nearestPreferred(value, series);
  return Math.abs(n.deviation) < 1e-3;
}
