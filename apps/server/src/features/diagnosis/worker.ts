// The diagnosis engine's thread. A first diagnosis of a board simulates every fault mode it ranks and takes
// seconds, which on the server's own thread would stall every other request; here it stalls only this thread.
// Engines are kept per board version (boards/engine.ts bounds how many and reports the ones it drops), so a later update of the same board
// reuses the diagnoser's prediction cache and is fast. Messages are answered one at a time, in arrival order.
import { parentPort } from 'node:worker_threads';
import { CaseError } from '@splitscope/diagnosis';
import { AppError } from '../../http/errors';
// The worker thread loads the board engine alone, not the boards feature's database service behind its index.
// eslint-disable-next-line import-x/no-restricted-paths
import { boardEngine, cachedBoardEngine, meterOptions, takeDroppedEngines } from '../boards/engine';
import type { WorkerFailure, WorkerReply, WorkerRequest } from './protocol';

function failure(err: unknown): WorkerFailure {
  if (err instanceof CaseError) return { kind: 'case', message: err.message };
  if (err instanceof AppError) return { kind: 'app', code: err.code, detail: err.detail, extra: err.extra };
  const e = err instanceof Error ? err : new Error(String(err));
  return { kind: 'other', message: e.message, stack: e.stack };
}

function answer({ id, versionId, readings, meter, document }: WorkerRequest): WorkerReply {
  try {
    const engine = document === undefined ? cachedBoardEngine(versionId) : boardEngine(versionId, document);
    // The server sends a document only for a version it has not sent before; one dropped from the bound since
    // is asked for again rather than guessed.
    if (!engine) return { id, dropped: takeDroppedEngines(), ok: false, missing: true };
    const output = engine.diagnoser.update(readings, meterOptions(meter));
    return { id, dropped: takeDroppedEngines(), ok: true, output };
  } catch (err) {
    return { id, dropped: takeDroppedEngines(), ok: false, error: failure(err) };
  }
}

parentPort!.on('message', (m: WorkerRequest) => parentPort!.postMessage(answer(m)));
