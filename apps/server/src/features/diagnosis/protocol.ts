// What the server and its diagnosis threads say to each other. Everything crosses by structured clone, so
// errors travel as plain data and are rebuilt on the server's side.
import type { CaseReading, DiagnosisOutput, PairColumn, UpdateOptions } from '@splitscope/diagnosis';
import type { MeterProfileId } from '@splitscope/contract';
import type { StoredDictionary } from './dictionary';
import type { AppError } from '../../http/errors';

export interface WorkerRequest {
  id: number;
  versionId: string;
  readings: CaseReading[];
  /** The meter profile the readings were taken with (a shipped profile id); null = the board's generic meter. */
  meter: MeterProfileId | null;
  /** The job's prior adjustments and failure history (structured-clone safe). */
  options?: Pick<UpdateOptions, 'priors' | 'history' | 'references'>;
  /** The board model document, sent only when this thread has not been given the version yet. */
  document?: unknown;
  /** The version's fault dictionary, sent once per thread when it is ready (dictionary.ts). */
  dictionary?: StoredDictionary;
  /** The version has a ready dictionary: a thread whose engine lacks it answers `missing` rather than simulate. */
  dictionaryReady?: boolean;
}

export type WorkerFailure =
  | { kind: 'case'; message: string }
  | { kind: 'app'; code: AppError['code']; detail: string; extra: AppError['extra'] }
  | { kind: 'other'; message: string; stack?: string };

/** Fault pairs a thread computed in the background after an answer, to be stored in the dictionary. */
export interface PairsMessage {
  pairs: true;
  versionId: string;
  columns: PairColumn[];
}

/**
 * `thread`: the answering thread's id, so the pool knows which thread now holds the version; `dropped`: versions
 * whose engine the thread let go since its last reply (they need their document again).
 */
export type WorkerReply = { id: number; thread: number; dropped: string[] } & (
  { ok: true; output: DiagnosisOutput } | { ok: false; missing: true } | { ok: false; error: WorkerFailure }
);
