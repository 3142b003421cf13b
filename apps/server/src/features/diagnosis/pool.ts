// The server's diagnosis threads. A small wrapper around node:worker_threads rather than a general pool
// package: what matters here is which thread already holds which board's engine (its prediction cache is what
// makes a later update fast), so calls go to the thread that has the board, a board document crosses to a
// thread once, and a thread that dies takes only its own pending calls with it.
import { Worker } from 'node:worker_threads';
import type { MeterProfileId } from '@splitscope/contract';
import type { CaseReading, DiagnosisOutput, PairColumn, UpdateOptions } from '@splitscope/diagnosis';
import { AppError } from '../../http/errors';
import type { StoredDictionary } from './dictionary';
import type { PairsMessage, WorkerFailure, WorkerReply, WorkerRequest } from './protocol';

const ENTRY = new URL('./worker-entry.mjs', import.meta.url);

interface Call {
  versionId: string;
  meter: MeterProfileId | null;
  readings: CaseReading[];
  options?: Pick<UpdateOptions, 'priors' | 'history' | 'references'>;
  loadDocument: () => Promise<unknown>;
  /** The version's fault dictionary when it is ready (sent to a thread once). */
  loadDictionary?: () => Promise<StoredDictionary | undefined>;
  /** Where fault pairs the thread computes after answering go (stored in the dictionary). */
  onPairs?: (columns: PairColumn[]) => void;
  resolve: (out: DiagnosisOutput) => void;
  reject: (err: unknown) => void;
}

interface Thread {
  worker: Worker;
  /** The versions this thread holds an engine for: sent to it, less those its engine cache reports dropped. */
  known: Set<string>;
  pending: Map<number, Call>;
  /** The versions whose dictionary this thread was sent. */
  dictionaries: Set<string>;
  /** Per version, where the pairs the thread computes for it go. */
  pairSinks: Map<string, (columns: PairColumn[]) => void>;
  /** What the thread threw before it exited, for the pending calls' error. */
  crash?: Error;
}

export interface PoolOptions {
  size: number;
  /** Starts a thread; tests wrap it to reach the Worker. */
  spawn?: () => Worker;
}

export const spawnDiagnosisWorker = () => new Worker(ENTRY, { name: 'splitscope-diagnosis' });

export class DiagnosisPool {
  private threads: Thread[] = [];
  private nextId = 1;
  private closed = false;

  constructor(private readonly options: PoolOptions) {}

  /** The engine's output for these readings on a board version; the document is loaded only if needed. */
  run(
    versionId: string,
    readings: CaseReading[],
    loadDocument: () => Promise<unknown>,
    dictionary: Pick<Call, 'loadDictionary' | 'onPairs'> = {},
    options?: Pick<UpdateOptions, 'priors' | 'history' | 'references'>,
    meter: MeterProfileId | null = null,
  ): Promise<DiagnosisOutput> {
    return new Promise(
      (resolve, reject) =>
        void this.dispatch({ versionId, readings, meter, loadDocument, ...dictionary, resolve, reject, ...(options ? { options } : {}) }, false),
    );
  }

  /**
   * Starts every thread now. A thread's first seconds go to loading the engine's modules (the circuit library
   * above all), which a first diagnosis would otherwise wait for.
   */
  warm(): void {
    while (!this.closed && this.threads.length < this.options.size) this.start();
  }

  /** Stops every thread; calls still pending are rejected. */
  async close(): Promise<void> {
    this.closed = true;
    const threads = this.threads;
    this.threads = [];
    for (const t of threads) this.fail(t, new Error('The diagnosis workers were stopped'));
    await Promise.all(threads.map((t) => t.worker.terminate()));
  }

  private async dispatch(call: Call, resend: boolean): Promise<void> {
    try {
      let thread = this.pick(call.versionId);
      const withDocument = resend || !thread.known.has(call.versionId);
      const document = withDocument ? await call.loadDocument() : undefined;
      const dictionary = (withDocument || !thread.dictionaries.has(call.versionId)) && call.loadDictionary ? await call.loadDictionary() : undefined;
      // The thread may have died while the document loaded; a new one is sent the document too.
      if (!this.threads.includes(thread)) thread = this.pick(call.versionId);
      if (dictionary) thread.dictionaries.add(call.versionId);
      if (call.onPairs) thread.pairSinks.set(call.versionId, call.onPairs);
      const id = this.nextId++;
      thread.known.add(call.versionId);
      thread.pending.set(id, call);
      // Referenced only while it owes an answer, so an idle thread never keeps the process alive.
      thread.worker.ref();
      const message: WorkerRequest = {
        id,
        versionId: call.versionId,
        readings: call.readings,
        meter: call.meter,
        ...(call.options ? { options: call.options } : {}),
        ...(withDocument ? { document } : {}),
        ...(dictionary ? { dictionary } : {}),
      };
      thread.worker.postMessage(message);
    } catch (err) {
      call.reject(err);
    }
  }

  /** A thread that holds the board and is idle, else any idle one, else a new one, else the least busy. */
  private pick(versionId: string): Thread {
    if (this.closed) throw new Error('The diagnosis workers were stopped');
    const idle = this.threads.filter((t) => t.pending.size === 0);
    const ready = idle.find((t) => t.known.has(versionId)) ?? idle[0];
    if (ready) return ready;
    if (this.threads.length < this.options.size) return this.start();
    const load = (a: Thread, b: Thread) => a.pending.size - b.pending.size;
    // A queued warm update usually beats a cold run on another thread.
    return [...this.threads].sort(load).find((t) => t.known.has(versionId)) ?? [...this.threads].sort(load)[0]!;
  }

  private start(): Thread {
    const worker = (this.options.spawn ?? spawnDiagnosisWorker)();
    worker.unref();
    const thread: Thread = { worker, known: new Set(), pending: new Map(), dictionaries: new Set(), pairSinks: new Map() };
    worker.on('message', (reply: WorkerReply | PairsMessage) =>
      'pairs' in reply ? thread.pairSinks.get(reply.versionId)?.(reply.columns) : this.answered(thread, reply),
    );
    worker.on('error', (err) => void (thread.crash = err));
    worker.on('exit', (code) => {
      this.threads = this.threads.filter((t) => t !== thread);
      // The next call starts a fresh thread, which is sent its documents again (its `known` starts empty).
      this.fail(thread, new Error(`The diagnosis worker stopped (exit code ${code})${thread.crash ? `: ${thread.crash.message}` : ''} before answering`));
    });
    this.threads.push(thread);
    return thread;
  }

  private answered(thread: Thread, reply: WorkerReply): void {
    for (const v of reply.dropped) {
      thread.known.delete(v);
      thread.dictionaries.delete(v);
    }
    const call = thread.pending.get(reply.id);
    if (!call) return;
    thread.pending.delete(reply.id);
    if (thread.pending.size === 0) thread.worker.unref();
    if (reply.ok) call.resolve(reply.output);
    else if ('missing' in reply) {
      thread.known.delete(call.versionId);
      thread.dictionaries.delete(call.versionId);
      void this.dispatch(call, true);
    } else call.reject(rebuild(reply.error));
  }

  private fail(thread: Thread, err: Error): void {
    const calls = [...thread.pending.values()];
    thread.pending.clear();
    for (const c of calls) c.reject(err);
  }
}

/** The engine's refusal of the readings is the caller's conflict; a board the engine cannot use keeps its 422. */
function rebuild(f: WorkerFailure): Error {
  if (f.kind === 'case') return new AppError('conflict', `The diagnosis engine cannot use these readings: ${f.message}`);
  if (f.kind === 'app') return new AppError(f.code, f.detail, f.extra);
  const err = new Error(f.message);
  if (f.stack) err.stack = f.stack;
  return err;
}

// One set of threads per process, like the diagnosis cache in front of it: the callers (the diagnosis route,
// the guided-order check, the snapshot on proposal) pass only a database handle. Each running server holds the
// set; the last one to stop ends the threads, and a call after that starts them again.
let shared: DiagnosisPool | undefined;
let size = 1;
let holders = 0;

export function diagnosisPool(): DiagnosisPool {
  return (shared ??= new DiagnosisPool({ size }));
}

/** `warm`: start the threads at once (a server that will be used), not at the first diagnosis (tests). */
export function holdDiagnosisPool(workers: number, { warm }: { warm: boolean }): void {
  holders++;
  size = workers;
  if (warm) diagnosisPool().warm();
}

export async function releaseDiagnosisPool(): Promise<void> {
  holders = Math.max(0, holders - 1);
  if (holders > 0 || !shared) return;
  const pool = shared;
  shared = undefined;
  await pool.close();
}
