/**
 * Resistor marking decoders.
 * - IEC 60062 colour code (3/4/5/6 bands): digits, multiplier, tolerance, temperature coefficient. Band values from
 *   colour-code charts citing IEC 60062:2016 (secondary). Grey as a tolerance band is left undecoded because the
 *   sources disagree.
 * - SMD codes (IEC 60062 letter-and-digit code): 3-digit AB×10^C, 4-digit ABC×10^D, R as the decimal point.
 * - EIA-96 (1 % parts): two digits index the E96 value, a letter gives the multiplier.
 */
import { E96 } from './eseries';

export const COLOURS = ['black', 'brown', 'red', 'orange', 'yellow', 'green', 'blue', 'violet', 'grey', 'white', 'gold', 'silver', 'pink', 'none'] as const;
export type Colour = (typeof COLOURS)[number];

const DIGIT: Partial<Record<Colour, number>> = { black: 0, brown: 1, red: 2, orange: 3, yellow: 4, green: 5, blue: 6, violet: 7, grey: 8, white: 9 };
const MULTIPLIER_EXP: Partial<Record<Colour, number>> = {
  pink: -3,
  silver: -2,
  gold: -1,
  black: 0,
  brown: 1,
  red: 2,
  orange: 3,
  yellow: 4,
  green: 5,
  blue: 6,
  violet: 7,
  grey: 8,
  white: 9,
};
/** Tolerance as a fraction. */
const TOLERANCE: Partial<Record<Colour, number>> = {
  brown: 0.01,
  red: 0.02,
  orange: 0.0005,
  yellow: 0.0002,
  green: 0.005,
  blue: 0.0025,
  violet: 0.001,
  gold: 0.05,
  silver: 0.1,
  none: 0.2,
};
/** Temperature coefficient, ppm/K. */
const TEMPCO: Partial<Record<Colour, number>> = { black: 250, brown: 100, red: 50, orange: 15, yellow: 25, green: 20, blue: 10, violet: 5, grey: 1 };

const ALIASES: Record<string, Colour> = { gray: 'grey', purple: 'violet', '': 'none' };

export class MarkingError extends Error {
  override name = 'MarkingError';
}

function colour(c: string): Colour {
  const k = c.trim().toLowerCase();
  const a = ALIASES[k] ?? k;
  if (!(COLOURS as readonly string[]).includes(a)) throw new MarkingError(`unknown colour "${c}"`);
  return a as Colour;
}

export interface ColourCode {
  ohms: number;
  /** Tolerance as a fraction (0.05 = ±5 %). */
  tolerance: number;
  tempcoPpmK?: number;
  bands: Colour[];
}

function digitOf(c: Colour, pos: number): number {
  const d = DIGIT[c];
  if (d === undefined) throw new MarkingError(`band ${pos}: ${c} is not a digit colour`);
  return d;
}

/** Decode IEC 60062 colour bands, read from the end away from the tolerance band. 3 bands = 20 % (no tolerance band). */
export function decodeColourBands(input: readonly string[] | string): ColourCode {
  const raw = typeof input === 'string' ? input.split(/[\s,;-]+/).filter(Boolean) : [...input];
  const bands = raw.map(colour);
  const n = bands.length;
  if (n < 3 || n > 6) throw new MarkingError(`a colour code has 3 to 6 bands, got ${n}`);
  const nDigits = n <= 4 ? 2 : 3;
  let sig = 0;
  for (let i = 0; i < nDigits; i++) sig = sig * 10 + digitOf(bands[i] as Colour, i + 1);
  const mc = bands[nDigits] as Colour;
  const exp = MULTIPLIER_EXP[mc];
  if (exp === undefined) throw new MarkingError(`band ${nDigits + 1}: ${mc} is not a multiplier colour`);
  let tolerance = 0.2;
  if (n >= 4) {
    const tc = bands[nDigits + 1] as Colour;
    const t = TOLERANCE[tc];
    if (t === undefined) {
      throw new MarkingError(
        tc === 'grey'
          ? `band ${nDigits + 2}: grey as a tolerance band is not decoded (sources disagree; check the part's datasheet)`
          : `band ${nDigits + 2}: ${tc} is not a tolerance colour`,
      );
    }
    tolerance = t;
  }
  const out: ColourCode = { ohms: Number((sig * 10 ** exp).toPrecision(12)), tolerance, bands };
  if (n === 6) {
    const tcc = bands[5] as Colour;
    const tc = TEMPCO[tcc];
    if (tc === undefined) throw new MarkingError(`band 6: ${tcc} is not a temperature-coefficient colour`);
    out.tempcoPpmK = tc;
  }
  return out;
}

/** Colour bands for a value (the inverse, for drawing parts): 4 bands for 2 significant digits, 5 for 3. */
export function colourBandsFor(ohms: number, tolerance = 0.05): Colour[] {
  if (!(ohms > 0)) throw new MarkingError('value must be positive');
  const tolColour = (Object.entries(TOLERANCE) as [Colour, number][]).find(([, t]) => Math.abs(t - tolerance) < 1e-9)?.[0];
  if (!tolColour) throw new MarkingError(`no colour for tolerance ${tolerance}`);
  const digits = tolerance <= 0.02 ? 3 : 2;
  const exp = Math.floor(Math.log10(ohms)) - (digits - 1);
  const sig = Math.round(ohms / 10 ** exp);
  const ds = String(sig).padStart(digits, '0').slice(0, digits).split('').map(Number);
  const byDigit = Object.entries(DIGIT) as [Colour, number][];
  const byExp = Object.entries(MULTIPLIER_EXP) as [Colour, number][];
  const mult = byExp.find(([, e]) => e === exp)?.[0];
  if (!mult) throw new MarkingError(`value ${ohms} is outside the colour code's multiplier range`);
  return [...ds.map((d) => byDigit.find(([, v]) => v === d)![0]), mult, tolColour];
}

export const EIA96_MULTIPLIER: Record<string, number> = {
  Z: 0.001,
  Y: 0.01,
  R: 0.01,
  X: 0.1,
  S: 0.1,
  A: 1,
  B: 10,
  H: 10,
  C: 100,
  D: 1e3,
  E: 1e4,
  F: 1e5,
};

export interface SmdCode {
  ohms: number;
  system: 'three-digit' | 'four-digit' | 'R-notation' | 'EIA-96' | 'zero-ohm';
  /** Usual tolerance of the code system: 3-digit ≈ 5 %, 4-digit and EIA-96 ≈ 1 % (common practice). */
  typicalTolerance: number;
}

/** Decode an SMD resistor code: "103", "4R7", "R47", "1002", "10R0", "01C", "000". */
export function decodeSmdCode(code: string): SmdCode {
  const c = code.trim().toUpperCase();
  if (/^0+$/.test(c)) return { ohms: 0, system: 'zero-ohm', typicalTolerance: 0 };
  const eia = /^(\d{2})([ZYRXSABHCDEF])$/.exec(c);
  if (eia) {
    const idx = Number(eia[1]);
    if (idx < 1 || idx > 96) throw new MarkingError(`EIA-96 code ${idx} out of range 01–96`);
    return {
      ohms: Number(((E96[idx - 1] as number) * (EIA96_MULTIPLIER[eia[2] as string] as number)).toPrecision(6)),
      system: 'EIA-96',
      typicalTolerance: 0.01,
    };
  }
  if (/^\d*R\d*$/.test(c) && c.length >= 2 && c.length <= 4 && c !== 'R') {
    return { ohms: Number(c.replace('R', '.')), system: 'R-notation', typicalTolerance: c.length === 4 ? 0.01 : 0.05 };
  }
  if (/^\d{3}$/.test(c)) {
    return { ohms: Number(c.slice(0, 2)) * 10 ** Number(c[2]), system: 'three-digit', typicalTolerance: 0.05 };
  }
  if (/^\d{4}$/.test(c)) {
    return { ohms: Number(c.slice(0, 3)) * 10 ** Number(c[3]), system: 'four-digit', typicalTolerance: 0.01 };
  }
  throw new MarkingError(`"${code}" is not a 3-digit, 4-digit, R-notation or EIA-96 resistor code`);
}

/** The EIA-96 code for a value in the E96 series ("10 kΩ" → "01C"), or null when the value is not an E96 value. */
export function eia96CodeFor(ohms: number): string | null {
  for (const [letter, mult] of Object.entries(EIA96_MULTIPLIER)) {
    if (letter === 'R' || letter === 'S' || letter === 'H') continue; // prefer Y/X/B
    const m = ohms / mult;
    const i = E96.findIndex((v) => Math.abs(v - m) < 1e-6 * v);
    if (i >= 0) return `${String(i + 1).padStart(2, '0')}${letter}`;
  }
  return null;
}
