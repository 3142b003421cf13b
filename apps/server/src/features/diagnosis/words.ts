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

// What the diagnosis engine says in words itself, when it does: a fault's designator, kind and mode words, and
// where each probe of a next test goes. Those are used first; the board's own words fill what it leaves out.
interface EngineFault {
  words?: { designator?: string; kind?: string; words?: string };
}
interface EngineTest {
  probes?: { red?: { label?: string }; black?: { label?: string } };
  liftedParts?: string[];
}

export function wordDiagnosis<T extends Out>(out: T, w: BoardWords): T {
  return {
    ...out,
    parts: out.parts.map((p) => {
      const e = (p as EngineFault).words;
      const designator = e?.designator ?? w.designator(p.part);
      const label = e?.designator && e.words ? `${[e.designator, e.kind].filter(Boolean).join(' ')} — ${e.words}` : w.fault(p.part, p.mode);
      return { ...p, designator, label };
    }),
    nextTests: out.nextTests.map((t) => {
      const e = t as EngineTest;
      return {
        ...t,
        redLabel: e.probes?.red?.label ?? w.probe(t.red),
        blackLabel: e.probes?.black?.label ?? w.probe(t.black),
        liftedLabels: e.liftedParts ?? t.lifted.map(w.designator),
        // The engine's sentence once it words its probes; before that, one built from the board's words.
        instruction: e.probes ? t.instruction : instruction(w, t),
      };
    }),
  };
}
