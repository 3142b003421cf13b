// The last diagnosis computed per job, so a screen that polls the diagnosis (or a trainee's guided-order check)
// does not run the engine again while nothing it reads has changed. Readings are append-only and a board version
// never changes, so a diagnosis is a pure function of the job's pinned version and its ordered current readings:
// the key names exactly those, and a new reading or a correction changes it. One entry per job, least recently
// used dropped first, so memory stays bounded however many jobs are open.
import { LRUCache } from 'lru-cache';
import type { Diagnosis } from '@splitscope/contract';

const entries = new LRUCache<string, { key: string; output: Diagnosis }>({ max: 200 });
// A first diagnosis can take seconds of engine time; requests for the same readings meanwhile wait for that one
// run instead of each starting their own.
const running = new Map<string, { key: string; done: Promise<Diagnosis> }>();

export interface Computed {
  /** The key of the readings the engine actually ran on (newer than asked for if one landed meanwhile). */
  key: string;
  output: Diagnosis;
}

/**
 * The job's diagnosis for the readings `key` names: the kept one, the one being computed, or a new run. The
 * answer is frozen, because every later caller shares the same object.
 */
export function diagnosisFor(jobId: string, key: string, compute: () => Promise<Computed>): Promise<Diagnosis> {
  const hit = entries.get(jobId);
  if (hit?.key === key) return Promise.resolve(hit.output);
  const pending = running.get(jobId);
  if (pending?.key === key) return pending.done;
  const done = compute().then(
    (c) => {
      if (running.get(jobId)?.done === done) running.delete(jobId);
      return keep(jobId, c);
    },
    (err: unknown) => {
      if (running.get(jobId)?.done === done) running.delete(jobId);
      throw err;
    },
  );
  running.set(jobId, { key, done });
  return done;
}

function keep(jobId: string, { key, output }: Computed): Diagnosis {
  const frozen = deepFreeze(output);
  entries.set(jobId, { key, output: frozen });
  return frozen;
}

function deepFreeze<T>(x: T): T {
  if (typeof x === 'object' && x !== null && !Object.isFrozen(x)) {
    Object.freeze(x);
    for (const v of Object.values(x)) deepFreeze(v);
  }
  return x;
}
