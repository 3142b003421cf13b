// What the server and its diagnosis threads say to each other. Everything crosses by structured clone, so
// errors travel as plain data and are rebuilt on the server's side.
import type { CaseReading, DiagnosisOutput } from '@splitscope/diagnosis';
import type { MeterProfileId } from '@splitscope/contract';
import type { AppError } from '../../http/errors';

export interface WorkerRequest {
  id: number;
  versionId: string;
  readings: CaseReading[];
  /** The meter profile the readings were taken with (a shipped profile id); null = the board's generic meter. */
  meter: MeterProfileId | null;
  /** The board model document, sent only when this thread has not been given the version yet. */
  document?: unknown;
}

export type WorkerFailure =
  | { kind: 'case'; message: string }
  | { kind: 'app'; code: AppError['code']; detail: string; extra: AppError['extra'] }
  | { kind: 'other'; message: string; stack?: string };

/** `dropped`: versions whose engine the thread let go since its last reply (they need their document again). */
export type WorkerReply = { id: number; dropped: string[] } & ({ ok: true; output: DiagnosisOutput } | { ok: false; missing: true } | { ok: false; error: WorkerFailure });
