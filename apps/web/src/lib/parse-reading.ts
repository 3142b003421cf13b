import type { MeterModeName } from '@splitscope/contract';

/** Parses what was typed with the board library's unit parser, loaded on first use (it brings mathjs). */
export async function parseTyped(text: string, mode: MeterModeName): Promise<{ ok: true; value: number | 'OL' } | { ok: false; error: string }> {
  const { parseReadingInput } = await import('@splitscope/boards/units');
  const r = parseReadingInput(text, mode === 'dcv' || mode === 'diode' ? 'V' : 'ohm');
  return r.ok ? { ok: true, value: r.value } : { ok: false, error: r.error };
}
