/**
 * Unit-aware reading input: what a technician types for a meter reading, parsed to an SI value.
 * Kept in its own module (it pulls in mathjs) so the web app can lazy-import it.
 *
 * Accepts: "2.2k", "4k7" (IEC 60062 letter-as-decimal-point code), "100n", "312 V", "OL", "14,9" (decimal comma),
 * "1.5 MΩ", "0.56", "4.7 µF", "12 kHz", "-0.3 mV".
 */
import { unit as mathUnit } from 'mathjs';

export type ReadingUnit = 'V' | 'ohm' | 'F' | 'A' | 'Hz';

export type ParsedReading = { ok: true; value: number | 'OL'; unit?: ReadingUnit; text: string } | { ok: false; error: string; text: string };

const PREFIX: Record<string, number> = { p: 1e-12, n: 1e-9, u: 1e-6, m: 1e-3, '': 1, k: 1e3, K: 1e3, M: 1e6, G: 1e9 };

const UNIT_WORDS: [RegExp, ReadingUnit][] = [
  [/^(ohms?|Ω|Ω|r)$/i, 'ohm'],
  [/^(v|volts?|vdc|vac)$/i, 'V'],
  [/^(f|farads?)$/i, 'F'],
  [/^(a|amps?)$/i, 'A'],
  [/^hz$/i, 'Hz'],
];
const MATH_UNIT: Record<ReadingUnit, string> = { V: 'V', ohm: 'ohm', F: 'F', A: 'A', Hz: 'Hz' };

function fail(text: string, error: string): ParsedReading {
  return { ok: false, error, text };
}

/**
 * Parse one typed reading. `expect` is the unit the field asks for; a typed unit must agree with it.
 * Returns a clear error instead of throwing.
 */
export function parseReadingInput(input: string, expect?: ReadingUnit): ParsedReading {
  const text = input;
  let s = input.trim().replace(/\u00a0/g, ' ');
  if (s === '') return fail(text, 'empty reading: type a number, e.g. "4.7k" or "312 V", or OL');
  if (/^[-+]?\s*(o\.?\s?l\.?|overload|open)$/i.test(s)) return { ok: true, value: 'OL', ...(expect ? { unit: expect } : {}), text };

  // Decimal comma: "14,9" → "14.9". A comma together with a dot, or more than one comma, is ambiguous.
  if (s.includes(',')) {
    if (s.includes('.') || s.split(',').length > 2) return fail(text, `"${input}": use one decimal separator, e.g. 14.9 or 14,9`);
    s = s.replace(',', '.');
  }
  s = s.replace(/[µμ]/g, 'u').replace(/Ω|Ω/g, 'ohm');

  // Letter-as-decimal-point code: 4k7, 2M2, 4R7, 0R5, 3n3, 4u7
  const rkm = /^([-+]?\d+)([pnumkKMGR])(\d+)\s*(.*)$/.exec(s);
  if (rkm) {
    const [, a, p, b, rest] = rkm as unknown as [string, string, string, string, string];
    s = `${a}.${b}${p === 'R' ? '' : p}${rest ? ' ' + rest : p === 'R' ? ' ohm' : ''}`;
  }

  const m = /^([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*([pnumkKMG]?)\s*([a-zA-Z]*)$/.exec(s);
  if (!m) return fail(text, `"${input}" is not a reading: type a number with an optional prefix and unit, e.g. 2.2k, 100n, 312 V, 14,9 or OL`);
  const [, num, prefixRaw, word] = m as unknown as [string, string, string, string];
  let prefix = prefixRaw;
  let unitWord = word;
  // "m" alone could be a prefix with no unit ("10m" = 10 milli) — fine. "M" alone = mega.
  if (!unitWord && prefix === '' && word === '') unitWord = '';
  let unit: ReadingUnit | undefined;
  if (unitWord) {
    const hit = UNIT_WORDS.find(([re]) => re.test(unitWord));
    if (!hit) {
      // "mV"-style strings where the regex took the prefix into the word, or an unknown unit
      return fail(text, `"${input}": unknown unit "${unitWord}" (use V, Ω/ohm, F, A or Hz)`);
    }
    unit = hit[1];
  }
  if (unit === undefined && expect) unit = expect;
  if (expect && unit !== expect) return fail(text, `"${input}" is in ${unit}, but this reading is in ${expect}`);

  let value: number;
  if (unit) {
    // mathjs does the prefix/unit arithmetic ("1.5 Mohm" → 1.5e6 ohm) so units and prefixes follow one set of rules.
    if (prefix === 'K') prefix = 'k';
    try {
      value = mathUnit(`${num} ${prefix}${MATH_UNIT[unit]}`).toNumber(MATH_UNIT[unit]);
    } catch (e) {
      return fail(text, `"${input}": ${(e as Error).message}`);
    }
  } else {
    const mult = PREFIX[prefix];
    if (mult === undefined) return fail(text, `"${input}": unknown prefix "${prefix}"`);
    value = Number(num) * mult;
  }
  if (!Number.isFinite(value)) return fail(text, `"${input}" is not a finite number`);
  return { ok: true, value: Number(value.toPrecision(12)), ...(unit ? { unit } : {}), text };
}

/** Like parseReadingInput but throws a RangeError with the same message. */
export function parseReadingInputOrThrow(input: string, expect?: ReadingUnit): { value: number | 'OL'; unit?: ReadingUnit } {
  const r = parseReadingInput(input, expect);
  if (!r.ok) throw new RangeError(r.error);
  return r.unit ? { value: r.value, unit: r.unit } : { value: r.value };
}
