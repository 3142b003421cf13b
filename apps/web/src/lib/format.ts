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
  if (typeof value === 'boolean') return value ? 'beeps' : 'no beep';
  if (value === 'OL') return 'OL';
  const u = unit === 'ohm' ? 'Ω' : (unit ?? '');
  if (value === 0) return `0 ${u}`.trim();
  const a = Math.abs(value);
  const [f, p] = PREFIXES.find(([f]) => a >= f) ?? [1e-6, 'µ'];
  const n = value / f;
  return `${Number(n.toPrecision(3))} ${p}${u}`.trim();
}

/** The meter function as the dial says it. */
export const METER_LABEL: Record<string, string> = {
  dcv: 'DC volts',
  ohm: 'Resistance (Ω)',
  diode: 'Diode test',
  continuity: 'Continuity',
};
