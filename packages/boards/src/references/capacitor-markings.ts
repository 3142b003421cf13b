/**
 * Capacitor marking decoders.
 * - Ceramic / film code (IEC 60062 letter-and-digit code, the same 3-digit scheme as resistors but in picofarads):
 *   two significant digits and a multiplier digit, "104" = 10·10⁴ pF = 100 nF; "R" or "p" marks the decimal point in
 *   pF ("4R7" = 4.7 pF); an optional tolerance letter follows (IEC 60062: B ±0.1 pF, C ±0.25 pF, D ±0.5 pF, F 1 %,
 *   G 2 %, J 5 %, K 10 %, M 20 %, Z +80/−20 %). Multiplier digits 8 and 9 (×0.01, ×0.1) are left undecoded: the
 *   charts disagree on them (common practice is to avoid them).
 * - Electrolytic rating as printed on the sleeve: capacitance and rated voltage ("470µF 400V", "470uF/400V",
 *   "47MFD 25VDC"); "MFD" is the older sleeve spelling of µF (common practice).
 */
import { MarkingError } from './markings';

const TOLERANCE_LETTER: Record<string, { relative?: number; absolutePf?: number; asymmetric?: [number, number] }> = {
  B: { absolutePf: 0.1 },
  C: { absolutePf: 0.25 },
  D: { absolutePf: 0.5 },
  F: { relative: 0.01 },
  G: { relative: 0.02 },
  J: { relative: 0.05 },
  K: { relative: 0.1 },
  M: { relative: 0.2 },
  Z: { asymmetric: [-0.2, 0.8] },
};

export interface CeramicCode {
  farads: number;
  /** Relative tolerance when the letter gives one (K = 0.1). */
  tolerance?: number;
  /** Absolute tolerance in pF for the small-value letters B, C, D. */
  tolerancePf?: number;
  /** Z: −20 % / +80 %. */
  asymmetric?: [number, number];
  /** Rated voltage when the marking carries it ("104K 50V"). */
  volts?: number;
}

/** Decode a ceramic/film capacitor code: "104", "104K", "473J 100V", "4R7", "2p2", "22" (plain pF). */
export function decodeCeramicCode(marking: string): CeramicCode {
  const text = marking.trim().toUpperCase().replace(/\s+/g, ' ');
  const m = /^(\d{1,3}|\d*[RP]\d+|\d+[RP]\d*)\s*([BCDFGJKMZ])?(?:\s*(\d+(?:\.\d+)?)\s*V(?:DC)?)?$/.exec(text);
  if (!m) throw new MarkingError(`"${marking}" is not a capacitor code (e.g. 104, 473J, 4R7, 2p2 with an optional tolerance letter)`);
  const code = m[1] as string;
  let pf: number;
  if (/[RP]/.test(code)) pf = Number(code.replace(/[RP]/, '.'));
  else if (code.length === 3) {
    const exp = Number(code[2]);
    if (exp > 6) throw new MarkingError(`"${code}": multiplier digit ${exp} is not decoded (charts disagree on 8 and 9; 7 is unused)`);
    pf = Number(code.slice(0, 2)) * 10 ** exp;
  } else pf = Number(code);
  if (!(pf > 0)) throw new MarkingError(`"${marking}" decodes to no capacitance`);
  const out: CeramicCode = { farads: Number((pf * 1e-12).toPrecision(12)) };
  const tol = m[2] ? TOLERANCE_LETTER[m[2]] : undefined;
  if (tol?.relative !== undefined) out.tolerance = tol.relative;
  if (tol?.absolutePf !== undefined) out.tolerancePf = tol.absolutePf;
  if (tol?.asymmetric) out.asymmetric = tol.asymmetric;
  if (m[3]) out.volts = Number(m[3]);
  return out;
}

export interface ElectrolyticRating {
  farads: number;
  volts: number;
}

// "MF"/"MFD" on old sleeves means microfarads, never millifarads (common practice), so "mF" is not read as milli.
const CAP_UNIT: Record<string, number> = { F: 1, UF: 1e-6, MF: 1e-6, MFD: 1e-6, NF: 1e-9, PF: 1e-12 };

/** Decode an electrolytic capacitor's sleeve rating: "470µF 400V", "470uF/400V", "400V 470uF", "47MFD 25VDC". */
export function decodeElectrolyticRating(marking: string): ElectrolyticRating {
  // Micro sign (U+00B5) and Greek mu (U+03BC) both appear on sleeves and in typed text; read both as "u".
  const text = marking.trim().replace(/[µμ]/g, 'u');
  const cap = /(\d+(?:[.,]\d+)?)\s*(uF|MFD|MF|nF|pF|F)(?![a-z])/i.exec(text);
  const volt = /(\d+(?:[.,]\d+)?)\s*(?:VDC|WV|V)(?![a-z])/i.exec(text.replace(cap?.[0] ?? '', ' '));
  if (!cap) throw new MarkingError(`"${marking}": no capacitance found (write it as on the sleeve, e.g. 470µF 400V)`);
  if (!volt) throw new MarkingError(`"${marking}": no rated voltage found (write it as on the sleeve, e.g. 470µF 400V)`);
  const scale = CAP_UNIT[(cap[2] as string).toUpperCase()];
  if (scale === undefined) throw new MarkingError(`"${marking}": unknown capacitance unit ${cap[2]}`);
  const value = Number((cap[1] as string).replace(',', '.'));
  const volts = Number((volt[1] as string).replace(',', '.'));
  if (!(value > 0) || !(volts > 0)) throw new MarkingError(`"${marking}": capacitance and voltage must be positive`);
  return { farads: Number((value * scale).toPrecision(12)), volts };
}
