// Each board version's fault dictionary (the diagnosis package's dictionary.ts), kept in PostgreSQL so that a
// restarted or a second server reads it instead of simulating. One process builds it, in a worker thread of its
// own: the first to claim the version's row (an insert that only one writer wins; a claim left by a process that
// died is taken over when it has not moved for two minutes). Until it is ready, diagnoses run as before and the
// bench shows the build's progress.
import { Worker } from 'node:worker_threads';
import { and, eq, isNull, lt, or, sql } from 'drizzle-orm';
import { DICTIONARY_FORMAT, fromBytes, toBytes, type ElectricalTest, type FaultDictionary, type PairColumn } from '@splitscope/diagnosis';
import type { Db } from '../../db/client';
import { boardModels, boardModelVersions, faultDictionaries, faultDictionaryPairs, faultDictionaryRows, jobs } from '../../db/schema';
import { ENGINE_VERSION } from './engine-version';

/** The engine that computed a dictionary: a newer engine (or layout) builds its own. */
export const DICTIONARY_ENGINE = `${ENGINE_VERSION}+dictionary${DICTIONARY_FORMAT}`;

export interface DictionaryState {
  state: 'ready' | 'building' | 'failed' | 'absent';
  partsDone: number;
  partsTotal: number;
}

export interface StoredDictionary {
  dictionary: FaultDictionary;
  pairs: PairColumn[];
}

export type BuilderMessage =
  | { kind: 'progress'; versionId: string; done: number; total: number }
  | { kind: 'done'; versionId: string; tests: ElectricalTest[]; faults: string[]; rows: Float64Array[] }
  | { kind: 'failed'; versionId: string; message: string };

const ready = new Map<string, StoredDictionary>();
/** Pair columns added per version in this process: part of the diagnosis cache key, so a new batch re-ranks. */
const generation = new Map<string, number>();
const byVersion = (versionId: string) => and(eq(faultDictionaries.versionId, versionId), eq(faultDictionaries.engineVersion, DICTIONARY_ENGINE));

export async function dictionaryState(db: Db, versionId: string): Promise<DictionaryState> {
  const hit = ready.get(versionId);
  if (hit) return { state: 'ready', partsDone: 1, partsTotal: 1 };
  const [row] = await db.select().from(faultDictionaries).where(byVersion(versionId));
  if (!row) return { state: 'absent', partsDone: 0, partsTotal: 0 };
  return { state: row.state, partsDone: row.partsDone, partsTotal: row.partsTotal };
}

/** What the diagnosis cache key adds for the dictionary: a diagnosis made before it (or a pair batch) was ready is stale. */
export const dictionaryStamp = (versionId: string) => `${ready.has(versionId) ? 'd' : '-'}${generation.get(versionId) ?? 0}`;

/** The version's dictionary with the pairs computed so far, once ready (read from the database once per process). */
export async function loadDictionary(db: Db, versionId: string): Promise<StoredDictionary | undefined> {
  const hit = ready.get(versionId);
  if (hit) return hit;
  const stored = await readStoredDictionary(db, versionId);
  if (stored) ready.set(versionId, stored);
  return stored;
}

/** The stored dictionary as the database holds it (no process memory involved), or undefined while not ready. */
export async function readStoredDictionary(db: Db, versionId: string): Promise<StoredDictionary | undefined> {
  const [head] = await db.select().from(faultDictionaries).where(byVersion(versionId));
  if (head?.state !== 'ready') return undefined;
  const rows = await db
    .select({ test: faultDictionaryRows.test, predictions: faultDictionaryRows.predictions })
    .from(faultDictionaryRows)
    .where(and(eq(faultDictionaryRows.versionId, versionId), eq(faultDictionaryRows.engineVersion, DICTIONARY_ENGINE)))
    .orderBy(faultDictionaryRows.position);
  const pairs = await db
    .select({ key: faultDictionaryPairs.faultKey, testKeys: faultDictionaryPairs.testKeys, predictions: faultDictionaryPairs.predictions })
    .from(faultDictionaryPairs)
    .where(and(eq(faultDictionaryPairs.versionId, versionId), eq(faultDictionaryPairs.engineVersion, DICTIONARY_ENGINE)));
  return {
    dictionary: { tests: rows.map((r) => r.test as ElectricalTest), faults: head.faults as string[], rows: rows.map((r) => fromBytes(r.predictions)) },
    pairs: pairs.map((p) => ({ key: p.key, testKeys: p.testKeys as string[], values: fromBytes(p.predictions) })),
  };
}

/** Stores pair columns a diagnosis thread computed, for every later process, and re-ranks this one's jobs. */
export async function savePairs(db: Db, versionId: string, columns: readonly PairColumn[]): Promise<void> {
  if (columns.length === 0) return;
  await db
    .insert(faultDictionaryPairs)
    .values(columns.map((c) => ({ versionId, engineVersion: DICTIONARY_ENGINE, faultKey: c.key, testKeys: c.testKeys, predictions: toBytes(c.values) })));
  ready.get(versionId)?.pairs.push(...columns);
  generation.set(versionId, (generation.get(versionId) ?? 0) + 1);
}

async function saveDictionary(db: Db, versionId: string, d: Omit<FaultDictionary, 'tests'> & { tests: ElectricalTest[] }): Promise<void> {
  await db.transaction(async (tx) => {
    await tx.delete(faultDictionaryRows).where(and(eq(faultDictionaryRows.versionId, versionId), eq(faultDictionaryRows.engineVersion, DICTIONARY_ENGINE)));
    const values = d.tests.map((test, position) => ({ versionId, engineVersion: DICTIONARY_ENGINE, position, test, predictions: toBytes(d.rows[position]!) }));
    for (let i = 0; i < values.length; i += 100) await tx.insert(faultDictionaryRows).values(values.slice(i, i + 100));
    await tx.update(faultDictionaries).set({ state: 'ready', faults: d.faults, updatedAt: new Date() }).where(byVersion(versionId));
  });
}

/** Claims the version's build for this process: true when this process is to build it. */
async function claim(db: Db, versionId: string): Promise<boolean> {
  const inserted = await db
    .insert(faultDictionaries)
    .values({ versionId, engineVersion: DICTIONARY_ENGINE, state: 'building' })
    .onConflictDoNothing()
    .returning({ v: faultDictionaries.versionId });
  if (inserted.length) return true;
  // A build whose process died (no progress for two minutes) or that failed is taken over.
  const taken = await db
    .update(faultDictionaries)
    .set({ state: 'building', partsDone: 0, updatedAt: new Date(), error: null })
    .where(
      and(
        byVersion(versionId),
        or(
          eq(faultDictionaries.state, 'failed'),
          and(eq(faultDictionaries.state, 'building'), lt(faultDictionaries.updatedAt, sql`now() - interval '2 minutes'`)),
        ),
      ),
    )
    .returning({ v: faultDictionaries.versionId });
  return taken.length > 0;
}

// The build queue of this process: one thread, one version at a time, so a build never takes both cores.
const BUILDER = new URL('./dictionary-worker-entry.mjs', import.meta.url);
const queue: { db: Db; versionId: string; document: unknown }[] = [];
let running: Promise<void> | undefined;
let enabled = false;

/** A server that will be used builds dictionaries; test servers (which come and go by the dozen) do not by default. */
export function enableDictionaryBuilds(on: boolean): void {
  enabled = on;
}

/** Queues the version's build when no process has it yet (called on publish, at start for open jobs' versions, and by the command). */
export async function ensureDictionary(db: Db, versionId: string, { force = false } = {}): Promise<void> {
  if (!enabled && !force) return;
  if (ready.has(versionId) || !(await claim(db, versionId))) return;
  const [v] = await db.select({ document: boardModelVersions.document }).from(boardModelVersions).where(eq(boardModelVersions.id, versionId));
  queue.push({ db, versionId, document: v?.document });
  running ??= drain().finally(() => (running = undefined));
}

const lacksDictionary = sql`not exists (select 1 from ${faultDictionaries} d where d.version_id = ${boardModelVersions.id} and d.engine_version = ${DICTIONARY_ENGINE} and d.state = 'ready')`;

/**
 * At start: the versions that open jobs (not closed) are diagnosed on and that lack a dictionary of this engine,
 * the only ones a technician may wait on soon (docs/decisions/0007). Every other version gets its dictionary on
 * publish, or from `pnpm dictionary:build`.
 */
export async function ensureOpenJobDictionaries(db: Db): Promise<number> {
  const missing = await db
    .selectDistinct({ id: boardModelVersions.id })
    .from(boardModelVersions)
    .innerJoin(jobs, eq(jobs.boardVersionId, boardModelVersions.id))
    .where(and(isNull(jobs.closedAt), lacksDictionary));
  for (const m of missing) await ensureDictionary(db, m.id);
  return missing.length;
}

/** Versions without a dictionary of this engine, all or those of boards whose id, key or name is `board`. */
export async function versionsLackingDictionary(db: Db, board?: string): Promise<{ id: string; board: string; version: number }[]> {
  const named = board ? or(eq(boardModels.id, board), eq(boardModels.key, board), eq(boardModels.name, board)) : undefined;
  return db
    .select({ id: boardModelVersions.id, board: boardModels.name, version: boardModelVersions.version })
    .from(boardModelVersions)
    .innerJoin(boardModels, eq(boardModels.id, boardModelVersions.boardId))
    .where(named ? and(lacksDictionary, named) : lacksDictionary)
    .orderBy(boardModels.name, boardModelVersions.version);
}

/** Resolves when this process's build queue is empty (the command waits on it). */
export const dictionaryBuildsIdle = (): Promise<void> => running ?? Promise.resolve();

async function drain(): Promise<void> {
  const worker = new Worker(BUILDER, { name: 'splitscope-dictionary' });
  try {
    for (let job = queue.shift(); job; job = queue.shift()) await buildOne(worker, job);
  } finally {
    await worker.terminate();
  }
}

function buildOne(worker: Worker, { db, versionId, document }: (typeof queue)[number]): Promise<void> {
  return new Promise((resolve) => {
    let writes = Promise.resolve();
    const write = (f: () => Promise<unknown>) =>
      void (writes = writes.then(f).then(
        () => undefined,
        () => undefined,
      ));
    const onMessage = (m: BuilderMessage) => {
      if (m.versionId !== versionId) return;
      if (m.kind === 'progress')
        write(() => db.update(faultDictionaries).set({ partsDone: m.done, partsTotal: m.total, updatedAt: new Date() }).where(byVersion(versionId)));
      else {
        worker.off('message', onMessage);
        worker.off('error', onError);
        if (m.kind === 'done') write(() => saveDictionary(db, versionId, m));
        else write(() => db.update(faultDictionaries).set({ state: 'failed', error: m.message, updatedAt: new Date() }).where(byVersion(versionId)));
        void writes.then(resolve);
      }
    };
    const onError = (err: Error) => onMessage({ kind: 'failed', versionId, message: err.message });
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.postMessage({ versionId, document });
  });
}
