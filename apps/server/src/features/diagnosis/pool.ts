// The server's diagnosis threads, run by piscina (docs/decisions/0008-diagnosis-pool-library.md). What matters
// here is which thread already holds which board's engine (its prediction cache and dictionary are what make a
// later update fast), so piscina's load balancer is given our own choice: an idle thread that holds the board,
// else any idle one, else a new one, else the least busy holder. A board document and its dictionary cross to a
// thread once; a thread that lacks one answers `missing` and the call is sent again with both. A thread that dies
// takes only its own pending calls with it; piscina starts its replacement.
import { Piscina, queueOptionsSymbol, type PiscinaTask } from 'piscina';
import type { MeterProfileId } from '@splitscope/contract';
import type { CaseReading, DiagnosisOutput, PairColumn, UpdateOptions } from '@splitscope/diagnosis';
import { AppError } from '../../http/errors';
import type { StoredDictionary } from './dictionary';
import type { PairsMessage, WorkerFailure, WorkerReply, WorkerRequest } from './protocol';

const ENTRY = new URL('./worker-entry.mjs', import.meta.url).href;
/** Calls a busy thread that holds the board may queue before the next call goes to another thread. */
const PER_THREAD = 4;

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
}

/** The request, and for piscina's balancer the board it is for (a symbol key does not cross to the thread). */
type Task = WorkerRequest & { [queueOptionsSymbol]: { versionId: string } };

type Balancer = NonNullable<NonNullable<ConstructorParameters<typeof Piscina>[0]>['loadBalancer']>;
type PoolThread = Parameters<Balancer>[1][number];

export interface PoolOptions {
  size: number;
}

export class DiagnosisPool {
  private piscina: Piscina<Task, WorkerReply> | undefined;
  /** Per thread id, the versions its engine holds, and whether with their dictionary (from the thread's replies). */
  private holds = new Map<number, Map<string, { dictionary: boolean }>>();
  private pairSinks = new Map<string, (columns: PairColumn[]) => void>();
  private nextId = 1;
  private closed = false;

  constructor(private readonly options: PoolOptions) {}

  /** The engine's output for these readings on a board version; the document is loaded only if needed. */
  async run(
    versionId: string,
    readings: CaseReading[],
    loadDocument: () => Promise<unknown>,
    dictionary: Pick<Call, 'loadDictionary' | 'onPairs'> = {},
    options?: Pick<UpdateOptions, 'priors' | 'history' | 'references'>,
    meter: MeterProfileId | null = null,
  ): Promise<DiagnosisOutput> {
    const call: Call = { versionId, readings, meter, loadDocument, ...dictionary, ...(options ? { options } : {}) };
    if (call.onPairs) this.pairSinks.set(versionId, call.onPairs);
    const first = await this.send(call, false);
    // Sent again at most once, with the document and dictionary: the thread that took it lacked them.
    const reply = 'missing' in first ? await this.send(call, true) : first;
    if (reply.ok) return reply.output;
    if ('missing' in reply) throw new Error(`The diagnosis worker could not open board version ${versionId}`);
    throw rebuild(reply.error);
  }

  /**
   * Starts every thread now. A thread's first seconds go to loading the engine's modules (the circuit library
   * above all), which a first diagnosis would otherwise wait for.
   */
  warm(): void {
    if (!this.closed) this.threads(this.options.size);
  }

  /** The live threads (tests stop one to see a call fail alone). */
  workers() {
    return this.piscina?.threads ?? [];
  }

  /** Stops every thread; calls still pending are rejected. */
  async close(): Promise<void> {
    this.closed = true;
    const piscina = this.piscina;
    this.piscina = undefined;
    await piscina?.destroy();
  }

  private async send(call: Call, resend: boolean): Promise<WorkerReply> {
    const held = this.holders(call.versionId);
    const dictionary = call.loadDictionary ? await call.loadDictionary() : undefined;
    const withDocument = resend || held.length === 0;
    const withDictionary = dictionary && (withDocument || !held.some((h) => h.dictionary));
    const request: WorkerRequest = {
      id: this.nextId++,
      versionId: call.versionId,
      readings: call.readings,
      meter: call.meter,
      dictionaryReady: dictionary !== undefined,
      ...(call.options ? { options: call.options } : {}),
      ...(withDocument ? { document: await call.loadDocument() } : {}),
      ...(withDictionary ? { dictionary } : {}),
    };
    if (this.closed) throw new Error('The diagnosis workers were stopped');
    let reply: WorkerReply;
    try {
      reply = await this.threads(0).run({ ...request, [queueOptionsSymbol]: { versionId: call.versionId } });
    } catch (err) {
      if (this.closed) throw new Error('The diagnosis workers were stopped', { cause: err });
      throw new Error(`The diagnosis worker stopped (${err instanceof Error ? err.message : String(err)}) before answering`, { cause: err });
    }
    const holds = this.holds.get(reply.thread) ?? new Map<string, { dictionary: boolean }>();
    this.holds.set(reply.thread, holds);
    for (const v of reply.dropped) holds.delete(v);
    if (reply.ok) holds.set(call.versionId, { dictionary: dictionary !== undefined });
    else if ('missing' in reply) holds.delete(call.versionId);
    return reply;
  }

  /** What the live threads hold of a version. */
  private holders(versionId: string): { dictionary: boolean }[] {
    const live = new Set(this.workers().map((w) => w.threadId));
    return [...this.holds].flatMap(([id, m]) => (live.has(id) && m.has(versionId) ? [m.get(versionId)!] : []));
  }

  private threads(minThreads: number): Piscina<Task, WorkerReply> {
    if (this.piscina) return this.piscina;
    const piscina = new Piscina<Task, WorkerReply>({
      filename: ENTRY,
      minThreads,
      maxThreads: this.options.size,
      // A thread's engines are its cache: an idle thread is kept, never reaped.
      idleTimeout: Infinity,
      concurrentTasksPerWorker: PER_THREAD,
      // An idle thread computes fault pairs in the background (worker.ts); piscina's default Atomics.wait loop
      // would block its event loop between calls and hold the pairs back until the next call.
      atomics: 'disabled',
      loadBalancer: (task, workers) => this.balance(task, workers),
    });
    piscina.on('message', (m: PairsMessage) => m.pairs && this.pairSinks.get(m.versionId)?.(m.columns));
    piscina.on('workerDestroy', (w: { id: number }) => this.holds.delete(w.id));
    // A thread that fails with no call pending is replaced by piscina; its pending calls got the error already.
    piscina.on('error', (err: unknown) => console.error('diagnosis worker failed', err));
    this.piscina = piscina;
    return piscina;
  }

  /** An idle thread that holds the board, else any idle one; null starts a new thread or queues the call. */
  private balance(task: PiscinaTask, workers: PoolThread[]): PoolThread | null {
    const versionId = (task[queueOptionsSymbol] as { versionId?: string } | null)?.versionId;
    const holds = (w: PoolThread) => versionId !== undefined && this.holds.get(w.id)?.has(versionId) === true;
    const idle = workers.filter((w) => w.currentUsage === 0 && !w.terminating);
    const ready = idle.find(holds) ?? idle[0];
    if (ready) return ready;
    if (workers.length < this.options.size) return null;
    // A queued warm update usually beats a cold run on another thread.
    const open = workers.filter((w) => w.currentUsage < PER_THREAD && !w.terminating).sort((a, b) => a.currentUsage - b.currentUsage);
    return open.find(holds) ?? open[0] ?? null;
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
