// The diagnosis in the bench's words: parts by their printed designators, faults and probe positions in words
// (the contract's boardWords over the pinned board model). The engine's own ids stay in the answer for the
// program; the screens show only these.
import { boardWords, METER_WORDS, wordsModelOf, type BoardWords, type Diagnosis } from '@splitscope/contract';

// A version never changes, so its words are built once.
const cache = new Map<string, BoardWords>();
export async function wordsOf(versionId: string, loadDocument: () => Promise<unknown>): Promise<BoardWords> {
  const hit = cache.get(versionId);
  if (hit) return hit;
  const words = boardWords(wordsModelOf(await loadDocument()));
  cache.set(versionId, words);
  if (cache.size > 100) cache.delete(cache.keys().next().value as string);
  return words;
}

type Out = Pick<Diagnosis, 'parts' | 'nextTests'>;

/** The sentence for a next test, from the probe positions in words. */
function instruction(w: BoardWords, t: Diagnosis['nextTests'][number]): string {
  const lifted = t.lifted.length ? ` with ${t.lifted.map(w.designator).join(', ')} lifted` : '';
  const how = t.power === 'off' ? `Unplug the board and discharge the bus, then measure ${METER_WORDS[t.mode]}` : `With the board powered, measure ${METER_WORDS[t.mode]}`;
  return `${how}${lifted}: red probe on ${w.probe(t.red)}, black probe on ${w.probe(t.black)}.`;
}

export function wordDiagnosis<T extends Out>(out: T, w: BoardWords): T {
  return {
    ...out,
    parts: out.parts.map((p) => ({ ...p, designator: w.designator(p.part), label: w.fault(p.part, p.mode) })),
    nextTests: out.nextTests.map((t) => ({
      ...t,
      redLabel: w.probe(t.red),
      blackLabel: w.probe(t.black),
      liftedLabels: t.lifted.map(w.designator),
      instruction: instruction(w, t),
    })),
  };
}
