import { METER_WORDS } from '@splitscope/contract';
/** Display helpers only: no engineering numbers are computed here. */

export function age(fromIso: string, now = Date.now()): string {
  const ms = Math.max(0, now - Date.parse(fromIso));
  const h = ms / 3_600_000;
  if (h < 1) return `${Math.max(1, Math.round(ms / 60_000))} min`;
  if (h < 48) return `${Math.round(h)} h`;
  return `${Math.round(h / 24)} d`;
}

export function dateTime(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

const PREFIXES: [number, string][] = [
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
];

/** An SI value as a technician writes it: 2.2 kΩ, 14.9 V, 0.61 V, OL. */
export function meterText(value: number | 'OL' | boolean | null | undefined, unit: 'V' | 'ohm' | string | undefined): string {
  if (value === null || value === undefined) return '—';
  if (typeof value === 'boolean') return value ? 'beep' : 'no beep';
  if (value === 'OL') return 'OL';
  const u = unit === 'ohm' ? 'Ω' : (unit ?? '');
  if (value === 0) return `0 ${u}`.trim();
  const a = Math.abs(value);
  const [f, p] = PREFIXES.find(([f]) => a >= f) ?? [1e-6, 'µ'];
  const n = value / f;
  return `${Number(n.toPrecision(3))} ${p}${u}`.trim();
}

/** The meter function as the dial says it (the contract's words). */
export const METER_LABEL: Record<string, string> = METER_WORDS;

interface ShownReading {
  mode: string;
  value: number | 'OL';
  unit: string;
  beep?: boolean | null;
  raw?: string;
}

/** A stored reading's value as the meter showed it: continuity as beep / no beep, the rest in SI with a prefix. */
export function readingText(r: ShownReading): string {
  if (r.mode === 'continuity') return (r.beep ?? r.value !== 'OL') ? 'beep' : 'no beep';
  return meterText(r.value, r.unit);
}

/** The board's state for a reading: powered or unplugged, and the parts lifted for it. */
export function boardStateText(r: { power: 'on' | 'off'; lifted: readonly string[] }): string {
  const power = r.power === 'on' ? 'powered' : 'unplugged';
  return r.lifted.length ? `${power}, ${r.lifted.join(', ')} lifted` : power;
}

/** A healthy band as the meter would show its ends; continuity has a yes/no expectation instead. */
export function bandText(v: { expected: number | 'OL' | boolean; low: number | null; high: number | null; unit: string }, mode: string): string {
  if (mode === 'continuity' || typeof v.expected === 'boolean') return meterText(typeof v.expected === 'boolean' ? v.expected : v.expected !== 'OL', v.unit);
  if (v.low === null || v.high === null) return meterText(v.expected, v.unit);
  return `${meterText(v.low, v.unit)} – ${meterText(v.high, v.unit)}`;
}

/** The verdict in words. */
export const verdictWord = (v: 'ok' | 'low' | 'high' | null | undefined) => (v === 'ok' ? 'healthy' : v === 'low' ? 'low' : v === 'high' ? 'high' : '—');
