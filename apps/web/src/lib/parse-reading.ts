import type { MeterModeName } from '@splitscope/contract';

// The board library's unit parser brings mathjs, so it stays out of the first load. The bench preloads it when
// it opens: a reading typed after the network drops must still parse, and a lazy chunk cannot load offline.
let parser: Promise<typeof import('@splitscope/boards/units')> | undefined;
export const preloadReadingParser = () => (parser ??= import('@splitscope/boards/units'));

/** Parses what was typed with the board library's unit parser. */
export async function parseTyped(text: string, mode: MeterModeName): Promise<{ ok: true; value: number | 'OL' } | { ok: false; error: string }> {
  const { parseReadingInput } = await preloadReadingParser();
  const r = parseReadingInput(text, mode === 'dcv' || mode === 'diode' ? 'V' : 'ohm');
  return r.ok ? { ok: true, value: r.value } : { ok: false, error: r.error };
}
