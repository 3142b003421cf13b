// Builds board versions' fault dictionaries off the server's thread (seconds of CPU per board). The result's rows
// cross back as transferred buffers, not copies.
import { parentPort } from 'node:worker_threads';
import { buildDictionary } from '@splitscope/diagnosis';
// The builder loads the board engine alone, not the boards feature's database service behind its index.
// eslint-disable-next-line import-x/no-restricted-paths
import { buildBoardEngine, readBoardModel } from '../boards/engine';
import type { BuilderMessage } from './dictionary';

parentPort!.on('message', ({ versionId, document }: { versionId: string; document: unknown }) => {
  const post = (m: BuilderMessage, transfer: ArrayBuffer[] = []) => parentPort!.postMessage(m, transfer);
  try {
    const engine = buildBoardEngine(versionId, readBoardModel(document));
    const dict = buildDictionary(engine.diagnoser, { onProgress: (done, total) => post({ kind: 'progress', versionId, done, total }) });
    post(
      { kind: 'done', versionId, tests: dict.tests, faults: dict.faults, rows: dict.rows },
      dict.rows.map((r) => r.buffer as ArrayBuffer),
    );
  } catch (err) {
    post({ kind: 'failed', versionId, message: err instanceof Error ? err.message : String(err) });
  }
});
