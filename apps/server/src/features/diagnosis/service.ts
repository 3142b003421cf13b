import { createHash } from 'node:crypto';
import { and, asc, desc, eq, sql } from 'drizzle-orm';
import type { CaseReading, DiagnosisOutput } from '@splitscope/diagnosis';
import {
  BOUNDS,
  readableDiagnosis,
  jobMeter,
  unitOf,
  type Diagnosis,
  type DiagnosisSnapshot,
  type MeterProfileId,
  type PriorSource,
} from '@splitscope/contract';
import type { Db } from '../../db/client';
import { boardModelVersions, diagnosisSnapshots, jobs, readingStrikes, readings, shops } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { diagnosisFor } from './cache';
import { dictionaryStamp, dictionaryState, loadDictionary, savePairs } from './dictionary';
import { ENGINE_VERSION } from './engine-version';
import { diagnosisPool } from './pool';
import { cachedJobPriors } from './priors-cache';
import { wordDiagnosis } from './words';

/** The same digest PostgreSQL's md5() gives, so a key computed here matches the one the database computes. */
const md5 = (text: string) => createHash('md5').update(text).digest('hex');
const keyOf = (versionId: string, meter: MeterProfileId | null, n: number, digest: string | null, priorsKey: string) =>
  `${versionId}|${meter ?? ''}|${n}|${digest ?? ''}|${priorsKey}`;

type ReadingRow = typeof readings.$inferSelect;
type JobRef = Pick<typeof jobs.$inferSelect, 'id' | 'boardVersionId'> & Partial<Pick<typeof jobs.$inferSelect, 'shopId' | 'boardId' | 'faultCode'>>;

const jobId = sql.placeholder('jobId');
// The readings the diagnosis works from: diagnosis-phase rows that no later row of the same job corrects
// (`readings` in the subquery is its own table, not the outer one).
const correctedIds = (db: Db) =>
  db
    .select({ id: readings.supersedes })
    .from(readings)
    .where(and(eq(readings.jobId, jobId), sql`${readings.supersedes} is not null`));
const struckIds = (db: Db) => db.select({ id: readingStrikes.readingId }).from(readingStrikes).where(eq(readingStrikes.jobId, jobId));
// A value outside the contract's physical bounds (stored before they were enforced, such as 1e308) is not one
// the engine is asked to reason about: it stays in the history for a correction, and out of the diagnosis.
const inBounds = sql`(${readings.value} is null or case when ${readings.mode} in ('dcv', 'diode')
  then ${readings.value} between ${sql.raw(String(BOUNDS.volts.min))} and ${sql.raw(String(BOUNDS.volts.max))}
  else ${readings.value} between ${sql.raw(String(BOUNDS.ohms.min))} and ${sql.raw(String(BOUNDS.ohms.max))} end)`;
const isCurrent = (db: Db) =>
  and(
    eq(readings.jobId, jobId),
    eq(readings.phase, 'diagnosis'),
    sql`${readings.id} not in (${correctedIds(db)})`,
    sql`${readings.id} not in (${struckIds(db)})`,
    inBounds,
  );
// The id breaks ties of equal timestamps, so the same readings always reach the engine in the same order.
const byTime = [asc(readings.takenAt), asc(readings.createdAt), asc(readings.id)];

// Built once per database handle; the statement names let pg parse each once per connection.
const prepared = new WeakMap<Db, ReturnType<typeof prepare>>();
function prepare(db: Db) {
  return {
    job: db
      .select({ id: jobs.id, boardVersionId: jobs.boardVersionId, shopId: jobs.shopId, boardId: jobs.boardId, faultCode: jobs.faultCode })
      .from(jobs)
      .where(and(eq(jobs.id, jobId), eq(jobs.shopId, sql.placeholder('shopId'))))
      .prepare('diagnosis_job'),
    // What the cache key is made of: how many current readings and a digest of their ids in engine order.
    key: db
      .select({
        n: sql<number>`count(*)::int`,
        digest: sql<string | null>`md5(string_agg(${readings.id}, ',' order by ${readings.takenAt}, ${readings.createdAt}, ${readings.id}))`,
      })
      .from(readings)
      .where(isCurrent(db))
      .prepare('diagnosis_readings_key'),
    rows: db
      .select()
      .from(readings)
      .where(isCurrent(db))
      .orderBy(...byTime)
      .prepare('diagnosis_readings'),
    // The meter the job's readings are read with: the job's own profile, else its shop's default.
    meter: db
      .select({ job: jobs.meterProfile, shop: shops.meterProfile })
      .from(jobs)
      .innerJoin(shops, eq(shops.id, jobs.shopId))
      .where(eq(jobs.id, jobId))
      .prepare('diagnosis_job_meter'),
    document: db
      .select({ document: boardModelVersions.document })
      .from(boardModelVersions)
      .where(eq(boardModelVersions.id, sql.placeholder('versionId')))
      .prepare('diagnosis_board_document'),
  };
}
function queries(db: Db) {
  let q = prepared.get(db);
  if (!q) prepared.set(db, (q = prepare(db)));
  return q;
}

/** The job's pinned version's document, for a diagnosis thread that has not been given it yet. */
async function documentOf(db: Db, versionId: string): Promise<unknown> {
  const [version] = await queries(db).document.execute({ versionId });
  if (!version) throw new AppError('not_found', `No board model version ${versionId}`);
  return version.document;
}

const caseValue = (r: ReadingRow): CaseReading['value'] => {
  if (r.mode === 'continuity') return r.beep ?? !r.overLimit;
  return r.overLimit ? 'OL' : r.value!;
};

/** What the job's priors are made of; callers that hold only the job's id and version have the rest read here. */
async function jobFacts(db: Db, job: JobRef) {
  if (job.shopId !== undefined && job.boardId !== undefined && job.faultCode !== undefined)
    return { ...job, shopId: job.shopId, boardId: job.boardId, faultCode: job.faultCode };
  const [row] = await db.select({ shopId: jobs.shopId, boardId: jobs.boardId, faultCode: jobs.faultCode }).from(jobs).where(eq(jobs.id, job.id));
  if (!row) throw new AppError('not_found', `No job ${job.id}`);
  return { ...job, ...row };
}

/** The diagnosis of a job of the shop; another shop's job is a 404. */
export async function getDiagnosis({ db, shopId, jobId: id }: { db: Db; shopId: string; jobId: string }): Promise<Diagnosis> {
  const [job] = await queries(db).job.execute({ jobId: id, shopId });
  if (!job) throw new AppError('not_found', `No job ${id}`);
  return computeDiagnosis({ db, job });
}

/**
 * Runs the diagnosis engine on a job's current readings against its pinned board model version. The answer is
 * cached per job while its current readings stay the same; the object is frozen and shared, not to be changed.
 */
export async function computeDiagnosis({ db, job }: { db: Db; job: JobRef }): Promise<Diagnosis> {
  const q = queries(db);
  const versionId = job.boardVersionId;
  const [facts, [k], [m], dictionary] = await Promise.all([
    jobFacts(db, job),
    q.key.execute({ jobId: job.id }),
    q.meter.execute({ jobId: job.id }),
    dictionaryState(db, versionId),
  ]);
  const meter = jobMeter(m?.job, m?.shop).profile;
  // The priors are kept with the readings key (priors-cache.ts): a poll or the read after a reading queries nothing.
  const before = await cachedJobPriors(db, facts, `${k?.n ?? 0}|${k?.digest ?? ''}`, () => documentOf(db, versionId));
  // A diagnosis made before the board's dictionary (or a batch of fault pairs) was ready is made again.
  const stamp = dictionaryStamp(versionId);
  const out = await diagnosisFor(job.id, `${keyOf(versionId, meter, k?.n ?? 0, k?.digest ?? null, before.key)}|${stamp}`, async () => {
    const rows = await currentReadings(db, job.id);
    // A worker thread runs the engine (seconds on a first run), so the server answers other requests meanwhile.
    const options = {
      priors: before.priors,
      ...(before.history ? { history: before.history } : {}),
      ...(before.references ? { references: before.references } : {}),
    };
    const out = await diagnosisPool().run(
      versionId,
      toCaseReadings(rows),
      () => documentOf(db, versionId),
      {
        loadDictionary: () => loadDictionary(db, versionId),
        onPairs: (columns) => void savePairs(db, versionId, columns).catch((err: unknown) => console.error('storing fault pairs failed', err)),
      },
      options,
      meter,
    );
    // Kept under the key of the rows it ran on: a reading stored since the key query makes that key differ.
    return {
      key: `${keyOf(versionId, meter, rows.length, rows.length ? md5(rows.map((r) => r.id).join(',')) : null, before.key)}|${stamp}`,
      output: shapeDiagnosis(wordDiagnosis(out), job, rows),
    };
  });
  // The build's progress changes while the answer does not: it is added per request, outside the kept answer.
  return dictionary.state === 'building' ? { ...out, preparing: { partsDone: dictionary.partsDone, partsTotal: dictionary.partsTotal } } : out;
}

/** A job's current readings in the order the engine reads them. */
export const currentReadings = (db: Db, id: string): Promise<ReadingRow[]> => queries(db).rows.execute({ jobId: id });

export const toCaseReadings = (rows: ReadingRow[]): CaseReading[] =>
  rows.map((r) => ({
    mode: r.mode,
    red: r.redNet,
    black: r.blackNet,
    power: r.power,
    lifted: r.lifted,
    ...(r.alone ? { alone: r.alone } : {}),
    value: caseValue(r),
  }));

/** The engine's output as the API tells it: each reading report joined back to its stored row. */
export function shapeDiagnosis(out: DiagnosisOutput, job: JobRef, rows: ReadingRow[]): Diagnosis {
  return {
    ...out,
    jobId: job.id,
    boardVersionId: job.boardVersionId,
    engineVersion: ENGINE_VERSION,
    priors: (out.priors ?? []).map((p) => ({
      part: p.part,
      mode: p.mode,
      designator: p.words.designator,
      label: p.words.text,
      before: p.before,
      after: p.after,
      steps: p.steps.map((s) => ({ ...s, source: s.source as PriorSource })),
    })),
    priorNotes: (out.priorNotes ?? []).map((n) => ({ ...n, source: n.source as PriorSource })),
    readings: out.readings.map((rep) => {
      const r = rows[rep.index]!;
      return {
        readingId: r.id,
        mode: r.mode,
        red: r.red,
        black: r.black,
        power: r.power,
        lifted: r.lifted,
        alone: r.alone,
        value: r.overLimit ? 'OL' : r.value!,
        unit: unitOf(r.mode),
        expected: rep.expected,
        low: rep.low ?? null,
        high: rep.high ?? null,
        verdict: rep.verdict,
      };
    }),
  };
}

export function toSnapshot(s: typeof diagnosisSnapshots.$inferSelect): DiagnosisSnapshot {
  const { output, unreadable } = readableDiagnosis(s.output);
  return {
    id: s.id,
    jobId: s.jobId,
    engineVersion: s.engineVersion,
    proposedPart: s.proposedPart,
    createdBy: s.createdBy,
    createdAt: iso(s.createdAt),
    output,
    ...(unreadable.length ? { unreadable } : {}),
  };
}

export async function findSnapshots({ db, jobId }: { db: Db; jobId: string }) {
  const rows = await db.select().from(diagnosisSnapshots).where(eq(diagnosisSnapshots.jobId, jobId)).orderBy(desc(diagnosisSnapshots.createdAt));
  return { items: rows.map(toSnapshot) };
}
