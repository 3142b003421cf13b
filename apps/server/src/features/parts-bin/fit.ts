import { binPartFits, boardWords, looksLikePartNumber, wordsModelOf, type FitSide } from '@splitscope/contract';
import { parseReadingInput } from '@splitscope/boards/units';
import { AppError } from '../../http/errors';

/**
 * A drawer's or a board part's value in SI units, parsed with the reading field's parser ("4k7", "100uF", "1.2 MΩ");
 * null for a part number ("1N4148"). Text that is neither ("banana") is refused with the parser's own words.
 */
export function valueOf(value: string, path = 'value'): number | null {
  const parsed = parseReadingInput(value);
  if (parsed.ok && typeof parsed.value === 'number') return parsed.value;
  if (looksLikePartNumber(value)) return null;
  const why = parsed.ok ? 'OL is a meter reading, not a part value' : parsed.error;
  throw new AppError('invalid', `"${value}" is not a part value or a part number (${why})`, {
    errors: [{ path, message: `not a value like 4k7, 100uF or 16 V, nor a part number like 1N4148` }],
  });
}

interface DocPart {
  designator: string;
  element?: string;
  value: string;
  nominal?: number;
  package: string;
}

/** The board model's part with this designator (as printed, or its netlist element), read leniently from the document. */
export function boardPartOf(document: unknown, designator: string): (FitSide & { designator: string }) | null {
  const parts = (document as { parts?: unknown } | null)?.parts;
  if (!Array.isArray(parts)) return null;
  const printed = boardWords(wordsModelOf(document)).designator(designator).toLowerCase();
  const found = (parts as DocPart[]).find(
    (p) => typeof p?.designator === 'string' && (p.designator.toLowerCase() === printed || p.element?.toLowerCase() === designator.toLowerCase()),
  );
  if (!found || typeof found.value !== 'string') return null;
  let nominal: number | null = typeof found.nominal === 'number' ? found.nominal : null;
  if (nominal === null) {
    const parsed = parseReadingInput(found.value);
    nominal = parsed.ok && typeof parsed.value === 'number' ? parsed.value : null;
  }
  return { designator: found.designator, value: found.value, nominal, package: String(found.package ?? '') };
}

/** Refuses a drawer whose part is not the board's: another value, another package, or no value at all. */
export function assertFits(document: unknown, designator: string, bin: FitSide) {
  const part = boardPartOf(document, designator);
  if (!part) throw new AppError('invalid', `${designator} is not a part of this board model`, { errors: [{ path: 'part', message: 'not on this board' }] });
  const fit = binPartFits(part, bin);
  if (!fit.ok) throw new AppError('invalid', `The drawer's part does not fit: ${fit.reason}`, { errors: [{ path: 'binPartId', message: fit.reason }] });
}
