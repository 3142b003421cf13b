import { unitOf, type MeterModeName } from '@splitscope/contract';

// The board library's unit parser brings mathjs, so it stays out of the first load. The bench preloads it when
// it opens: a reading typed after the network drops must still parse, and a lazy chunk cannot load offline.
let parser: Promise<typeof import('@splitscope/boards/units')> | undefined;
export const preloadReadingParser = () => (parser ??= import('@splitscope/boards/units'));

const BEEP = /^(b|beep|beeps|yes|y)$/i;
const NO_BEEP = /^(n|no|no ?beep|silent|none)$/i;

/**
 * Parses what was typed with the board library's unit parser. On continuity the meter's answer is a beep or
 * none: "beep" / "b" and "no beep" / "n" are taken as such (a beep is stored as 0 Ω, no beep as OL); ohms typed
 * from the display are taken too.
 */
export async function parseTyped(
  text: string,
  mode: MeterModeName,
): Promise<{ ok: true; value: number | 'OL'; beep?: boolean } | { ok: false; error: string }> {
  if (mode === 'continuity') {
    const t = text.trim();
    if (BEEP.test(t)) return { ok: true, value: 0, beep: true };
    if (NO_BEEP.test(t)) return { ok: true, value: 'OL', beep: false };
  }
  const { parseReadingInput } = await preloadReadingParser();
  const r = parseReadingInput(text, unitOf(mode));
  if (!r.ok) return { ok: false, error: mode === 'continuity' ? `${r.error}. On continuity type beep (b) or no beep (n).` : r.error };
  return { ok: true, value: r.value };
}
