/**
 * One entry point for the board capture's value fields: what is printed on a part → its nominal value. The
 * technician types what they read; the decoder that fits the part's kind turns it into SI units, or says why not.
 */
import { decodeCeramicCode, decodeElectrolyticRating } from './capacitor-markings';
import { decodeColourBands, decodeSmdCode, MarkingError } from './markings';

export type MarkedKind = 'resistor' | 'ceramic-capacitor' | 'electrolytic-capacitor';

export interface DecodedMarking {
  /** Ohms or farads. */
  nominal: number;
  /** Relative tolerance when the marking gives one. */
  tolerance?: number;
  /** Rated voltage, for capacitors that print it. */
  volts?: number;
  /** How it was read, in the bench's words ("colour bands, IEC 60062"). */
  how: string;
}

const COLOUR_WORD = /^[a-z]+$/i;

/** Decodes a marking as the given part kind: resistors by colour bands or SMD code, capacitors by code or sleeve rating. */
export function decodeMarking(kind: MarkedKind, marking: string): DecodedMarking {
  const text = marking.trim();
  if (!text) throw new MarkingError('type what is printed on the part');
  if (kind === 'resistor') {
    const words = text.split(/[\s,;-]+/).filter(Boolean);
    if (words.length >= 3 && words.every((w) => COLOUR_WORD.test(w))) {
      const c = decodeColourBands(words);
      return { nominal: c.ohms, tolerance: c.tolerance, how: `colour bands (IEC 60062)` };
    }
    const s = decodeSmdCode(text);
    return { nominal: s.ohms, tolerance: s.typicalTolerance, how: `SMD code, ${s.system} (IEC 60062${s.system === 'EIA-96' ? ', EIA-96' : ''})` };
  }
  if (kind === 'ceramic-capacitor') {
    const c = decodeCeramicCode(text);
    return {
      nominal: c.farads,
      ...(c.tolerance !== undefined ? { tolerance: c.tolerance } : {}),
      ...(c.volts ? { volts: c.volts } : {}),
      how: 'capacitor code in pF (IEC 60062)',
    };
  }
  const e = decodeElectrolyticRating(text);
  return { nominal: e.farads, volts: e.volts, how: 'sleeve rating' };
}

/** A value in SI units with its prefix, as a part list prints it: 4700 Ω → "4.7 kΩ", 1e-7 F → "100 nF". */
export function formatSi(v: number, unit: string): string {
  const steps: [number, string][] = [
    [1e6, 'M'],
    [1e3, 'k'],
    [1, ''],
    [1e-3, 'm'],
    [1e-6, 'µ'],
    [1e-9, 'n'],
    [1e-12, 'p'],
  ];
  const [scale, prefix] = steps.find(([s]) => Math.abs(v) >= s * 0.9999) ?? steps[steps.length - 1]!;
  return `${Number((v / scale).toPrecision(3))} ${prefix}${unit}`;
}
