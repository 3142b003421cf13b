// The diagnosis engine's thread. A first diagnosis of a board simulates every fault mode it ranks and takes
// seconds, which on the server's own thread would stall every other request; here it stalls only this thread.
// Engines are kept per board version (boards/engine.ts bounds how many and reports the ones it drops), so a later update of the same board
// reuses the diagnoser's prediction cache and is fast. The pool library (pool.ts) calls the default export once per
// request, one at a time; fault pairs go back outside those answers, as plain messages on the thread's port.
import { parentPort, threadId } from 'node:worker_threads';
import { addPairs, attachDictionary, CaseError, computePairs, takeWantedPairs, type Diagnoser } from '@splitscope/diagnosis';
import { AppError } from '../../http/errors';
// The worker thread loads the board engine alone, not the boards feature's database service behind its index.
// eslint-disable-next-line import-x/no-restricted-paths
import { boardEngine, cachedBoardEngine, meterOptions, takeDroppedEngines } from '../boards/engine';
import type { PairsMessage, WorkerFailure, WorkerReply, WorkerRequest } from './protocol';

function failure(err: unknown): WorkerFailure {
  if (err instanceof CaseError) return { kind: 'case', message: err.message };
  if (err instanceof AppError) return { kind: 'app', code: err.code, detail: err.detail, extra: err.extra };
  const e = err instanceof Error ? err : new Error(String(err));
  return { kind: 'other', message: e.message, stack: e.stack };
}

const withDictionary = new WeakSet<Diagnoser>();

export default function answer({ id, versionId, readings, meter, document, dictionary, dictionaryReady, options }: WorkerRequest): WorkerReply {
  const reply = { id, thread: threadId };
  try {
    const engine = document === undefined ? cachedBoardEngine(versionId) : boardEngine(versionId, document);
    // The server sends a document only for a version no thread holds yet; a thread that lacks it (another
    // thread took the call, or the engine was dropped from the bound since) asks for it again rather than guess,
    // and so does one whose engine lacks the ready dictionary, which would otherwise simulate for seconds.
    const lacksDictionary = dictionaryReady && !dictionary && engine && !withDictionary.has(engine.diagnoser);
    if (!engine || lacksDictionary) return { ...reply, dropped: takeDroppedEngines(), ok: false, missing: true };
    if (dictionary && !withDictionary.has(engine.diagnoser)) {
      attachDictionary(engine.diagnoser, dictionary.dictionary, dictionary.pairs);
      withDictionary.add(engine.diagnoser);
    }
    // A board that is its photo only has no model: its readings are recorded, not judged, so none is evidence.
    // The dictionary holds the board's own meter; another profile's predictions are solved as asked (ADR 0005).
    const photoOnly = engine.testPoints.length === 0 && Object.keys(engine.parts).length === 0;
    const output = engine.diagnoser.update(photoOnly ? [] : readings, { ...options, ...meterOptions(meter) });
    schedulePairs(versionId, engine.diagnoser);
    return { ...reply, dropped: takeDroppedEngines(), ok: true, output };
  } catch (err) {
    return { ...reply, dropped: takeDroppedEngines(), ok: false, error: failure(err) };
  }
}

// Fault pairs the answer marked as being checked are computed after it, a batch per turn of the event loop, so a
// request that arrives meanwhile is answered between batches (from the dictionary, at once).
const PAIR_BATCH = 24;
function schedulePairs(versionId: string, diagnoser: Diagnoser): void {
  const work = takeWantedPairs(diagnoser);
  const step = (from: number) => {
    if (from >= work.length) return;
    const columns = computePairs(diagnoser, work.slice(from, from + PAIR_BATCH));
    addPairs(diagnoser, columns);
    const message: PairsMessage = { pairs: true, versionId, columns };
    parentPort!.postMessage(message);
    setImmediate(step, from + PAIR_BATCH);
  };
  if (work.length > 0) setImmediate(step, 0);
}
