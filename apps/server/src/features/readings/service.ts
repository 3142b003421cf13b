import { createHash } from 'node:crypto';
import { and, asc, eq, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { LRUCache } from 'lru-cache';
import {
  acceptsReadings,
  correctionRefusal,
  guidedOrderBinds,
  readingRefusal,
  jobMeter,
  statusesTakingReadings,
  type CreateReadingInput,
  type CreateReadingResponse,
  type JobStatus,
  type StoredReading,
  unitOf,
} from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { boardModelVersions, jobs, readingStrikes, readings, shops, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { boardEngine, cachedBoardEngine, meterOf, powerRefusal, resolveAlone, resolveNet, resolveParts, verdictFor } from '../boards';
import { capturedPointIds } from '../capture';
import { getDutyRules } from '../duties';
import { getJobRow } from '../../db/job-row';
import { traineeGuidedLifted } from '../users';
import { checkGuidedStep, checkSafetyGate } from './guided';
import { toReading } from './stored-reading';
import { insertReading, type NewReading, type ReadingRow } from './write-batch';

const later = alias(readings, 'later');

const striker = alias(users, 'striker');

function rowsQuery(db: Db) {
  return db
    .select({ r: readings, authorName: users.name, supersededBy: later.id, strike: readingStrikes, strikerName: striker.name })
    .from(readings)
    .innerJoin(users, eq(users.id, readings.authorId))
    .leftJoin(later, eq(later.supersedes, readings.id))
    .leftJoin(readingStrikes, eq(readingStrikes.readingId, readings.id))
    .leftJoin(striker, eq(striker.id, readingStrikes.authorId));
}

/** The full history (or only current rows), oldest first. */
export async function findReadings({
  db,
  shopId,
  jobId,
  view,
  phase,
}: {
  db: Db;
  shopId: string;
  jobId: string;
  view: 'all' | 'current';
  phase?: 'diagnosis' | 'verification';
}) {
  await getJobRow(db, shopId, jobId);
  const where = [eq(readings.jobId, jobId)];
  if (phase) where.push(eq(readings.phase, phase));
  if (view === 'current') where.push(sql`${later.id} is null and ${readingStrikes.id} is null`);
  const rows = await rowsQuery(db)
    .where(and(...where))
    .orderBy(asc(readings.takenAt), asc(readings.createdAt));
  return {
    items: rows.map((x) =>
      toReading(x.r, x.authorName, x.supersededBy, x.strike ? { reason: x.strike.reason, authorName: x.strikerName ?? '', at: iso(x.strike.createdAt) } : null),
    ),
  };
}

/**
 * Strikes a reading out with a reason. Nothing is updated or deleted: the strike is a row of its own, and the
 * diagnosis and the sign-off leave struck readings out. A trainee strikes only on a job assigned to them.
 */
export async function strikeReading({
  db,
  actor,
  jobId,
  readingId,
  reason,
}: {
  db: Db;
  actor: Actor;
  jobId: string;
  readingId: string;
  reason: string;
}): Promise<StoredReading> {
  const job = await getJobRow(db, actor.shopId, jobId);
  if (actor.role === 'trainee' && job.assigneeId !== actor.id) throw new AppError('forbidden', 'Trainees strike readings only on jobs assigned to them');
  const [row] = await rowsQuery(db).where(and(eq(readings.id, readingId), eq(readings.jobId, jobId)));
  if (!row) throw new AppError('not_found', `No reading ${readingId} on this job`);
  checkOpen(job.status, row.r.phase);
  if (row.supersededBy) throw new AppError('conflict', 'This reading was already corrected; strike the correction instead');
  if (row.strike) throw new AppError('conflict', `This reading was already struck out by ${row.strikerName ?? 'someone'}: “${row.strike.reason}”`);
  try {
    await db.insert(readingStrikes).values({ id: newId(), shopId: actor.shopId, jobId, readingId, reason, authorId: actor.id });
  } catch (err) {
    if ((err as { code?: string }).code === '23505') throw new AppError('conflict', 'This reading was struck out meanwhile');
    throw err;
  }
  const [after] = await rowsQuery(db).where(eq(readings.id, readingId));
  return toReading(after!.r, after!.authorName, after!.supersededBy, {
    reason,
    authorName: after!.strikerName ?? actor.name,
    at: iso(after!.strike!.createdAt),
  });
}

const withVerdict = (r: StoredReading): CreateReadingResponse => ({
  ...r,
  expected: r.verdict?.expected ?? null,
  low: r.verdict?.low ?? null,
  high: r.verdict?.high ?? null,
});

const p = sql.placeholder;
// The meter the job's readings are read with (the job's profile, else the shop's): it can change on the bench,
// so it is read with every write rather than kept, in the query the write makes anyway.
const meterColumns = { job: jobs.meterProfile, shop: shops.meterProfile };
type MeterRow = { job: string | null; shop: string | null };
const stored = alias(readings, 'stored');

// The write path's statements, built once per database handle and named so pg parses each once per connection.
const prepared = new WeakMap<Db, ReturnType<typeof prepare>>();
function prepare(db: Db) {
  return {
    // The job (of this shop only) with its meter and, in the same round trip, the row a retry with this key already stored.
    jobAndReplay: db
      .select({
        job: { id: jobs.id, status: jobs.status, assigneeId: jobs.assigneeId, boardVersionId: jobs.boardVersionId, guidedLiftedBy: jobs.guidedLiftedBy },
        meter: meterColumns,
        r: stored,
        authorName: users.name,
        supersededBy: later.id,
      })
      .from(jobs)
      .innerJoin(shops, eq(shops.id, jobs.shopId))
      .leftJoin(stored, and(eq(stored.jobId, jobs.id), eq(stored.idempotencyKey, p('key'))))
      .leftJoin(users, eq(users.id, stored.authorId))
      .leftJoin(later, eq(later.supersedes, stored.id))
      .where(and(eq(jobs.id, p('jobId')), eq(jobs.shopId, p('shopId'))))
      .prepare('reading_job_and_replay'),
    // A plain write's one look at the job before it is stored: its meter, and the board version it pins (used
    // only when the version is not cached yet).
    meter: db
      .select({ meter: meterColumns, boardVersionId: jobs.boardVersionId })
      .from(jobs)
      .innerJoin(shops, eq(shops.id, jobs.shopId))
      .where(and(eq(jobs.id, p('jobId')), eq(jobs.shopId, p('shopId'))))
      .prepare('reading_job_meter'),
    version: db
      .select({ document: boardModelVersions.document, expectedReadings: boardModelVersions.expectedReadings })
      .from(boardModelVersions)
      .where(eq(boardModelVersions.id, p('versionId')))
      .prepare('reading_board_version'),
    corrects: db
      .select({
        mode: readings.mode,
        redNet: readings.redNet,
        blackNet: readings.blackNet,
        power: readings.power,
        lifted: readings.lifted,
        authorId: readings.authorId,
      })
      .from(readings)
      .where(and(eq(readings.id, p('id')), eq(readings.jobId, p('jobId'))))
      .prepare('reading_corrects'),
  };
}
function queries(db: Db) {
  let q = prepared.get(db);
  if (!q) prepared.set(db, (q = prepare(db)));
  return q;
}

// A job's shop and board version never change, so which version a job of a shop pins is kept once looked up:
// a plain reading write then waits for no query before its checks and the engine (its meter query runs meanwhile).
const versions = new LRUCache<string, string>({ max: 1000 });
async function boardVersionOf(shopId: string, jobId: string, jobRow: Promise<{ boardVersionId: string } | undefined>): Promise<string | undefined> {
  const key = `${shopId}\n${jobId}`;
  const hit = versions.get(key);
  if (hit) return hit;
  const row = await jobRow;
  if (!row) return undefined;
  versions.set(key, row.boardVersionId);
  return row.boardVersionId;
}

const invalid = (path: string, message: string) => new AppError('invalid', message, { errors: [{ path, message }] });

function checkOpen(status: JobStatus, phase: CreateReadingInput['phase']): void {
  if (!acceptsReadings(status, phase))
    throw new AppError('conflict', `A ${phase} reading is taken while the job is ${statusesTakingReadings(phase).join(' or ')}; this job is ${status}`);
}

type JobState = { id: string; status: JobStatus; assigneeId: string | null; boardVersionId: string; guidedLiftedBy: string | null };

/** Object keys in a fixed order at every depth, so two equal requests serialise to the same text. */
const canonical = (v: unknown): unknown =>
  Array.isArray(v)
    ? v.map(canonical)
    : v && typeof v === 'object'
      ? Object.fromEntries(
          Object.keys(v)
            .sort()
            .map((k) => [k, canonical((v as Record<string, unknown>)[k])]),
        )
      : v;

/** What a retry must repeat: the request as parsed (defaults filled in, text trimmed), hashed. */
export const requestHashOf = (input: CreateReadingInput) =>
  createHash('sha256')
    .update(JSON.stringify(canonical(input)))
    .digest('base64url');

/** The job as a checked write sees it first: of this shop, open to this actor, and any row this key stored. */
async function jobAndReplay(
  db: Db,
  actor: Actor,
  jobId: string,
  input: CreateReadingInput,
): Promise<{ job: JobState; meter: MeterRow; replay: CreateReadingResponse | null }> {
  const [found] = await queries(db).jobAndReplay.execute({ jobId, shopId: actor.shopId, key: input.idempotencyKey });
  if (!found) throw new AppError('not_found', `No job ${jobId}`);
  const { job } = found;
  const refused = readingRefusal(actor.role, input.phase, job.assigneeId === actor.id);
  if (refused) throw new AppError('forbidden', refused);
  // A key names one reading: the same key with another body is a client bug (or two readings sharing a key),
  // and answering the stored row as if it were this one would lose the new reading without a word.
  if (found.r?.requestHash && found.r.requestHash !== requestHashOf(input)) {
    throw new AppError(
      'conflict',
      `Idempotency key ${input.idempotencyKey} was already used for a different reading (key reused with a different reading); send this reading with a new key`,
    );
  }
  return { job, meter: found.meter, replay: found.r ? withVerdict(toReading(found.r, found.authorName!, found.supersededBy)) : null };
}

/**
 * Stores one reading with its verdict. A retry with the same idempotency key answers the stored row and
 * stores nothing; a correction is a new row naming the one it supersedes.
 *
 * A trainee's step and a correction are checked against the job before they are stored. A plain reading is
 * checked by the statement that stores it (the job's shop and status, the key not used yet), and only when that
 * stores nothing does a second look say why: a replay, a closed job or no such job.
 */
export async function createReading({
  db,
  actor,
  jobId,
  input,
}: {
  db: Db;
  actor: Actor;
  jobId: string;
  input: CreateReadingInput;
}): Promise<CreateReadingResponse> {
  const q = queries(db);
  let versionId: string;
  let job: JobState | undefined;
  let meterRow: Promise<MeterRow | undefined>;
  if (actor.role === 'trainee' || input.supersedes) {
    const seen = await jobAndReplay(db, actor, jobId, input);
    if (seen.replay) return seen.replay;
    checkOpen(seen.job.status, input.phase);
    job = seen.job;
    versionId = job.boardVersionId;
    meterRow = Promise.resolve(seen.meter);
  } else {
    // Started now, read when the verdict is computed: it overlaps the checks below.
    const jobRow = q.meter.execute({ jobId, shopId: actor.shopId }).then((rows) => rows[0]);
    // A check below may throw first; the query's own failure is then not the one to report.
    jobRow.catch(() => undefined);
    meterRow = jobRow.then((row) => row?.meter);
    meterRow.catch(() => undefined);
    const v = await boardVersionOf(actor.shopId, jobId, jobRow);
    if (!v) throw new AppError('not_found', `No job ${jobId}`);
    versionId = v;
  }
  const why = powerRefusal(input.mode, input.power);
  if (why) throw invalid('power', why);
  if (input.value !== 'OL' && input.mode === 'ohm' && input.value < 0) throw invalid('value', `A resistance cannot be negative (${input.value} ohm)`);

  // A version never changes, so it is loaded only to build the engine once (with the expected table stored
  // beside it, which the verdicts read), or for the safety gate.
  let version: { document: unknown; expectedReadings: unknown } | undefined;
  const loadVersion = async () => {
    version ??= (await q.version.execute({ versionId }))[0]!;
    return version;
  };
  let engine = cachedBoardEngine(versionId);
  if (!engine) {
    const v = await loadVersion();
    engine = boardEngine(versionId, v.document, v.expectedReadings);
  }
  // A board that is its photo only takes readings on the points marked on its photo: recorded, not judged.
  // So does a board whose stored model the schema rejects, on the test points of it that still read.
  const photoPoints = engine.unreadable
    ? new Set(engine.unreadable.points)
    : engine.testPoints.length === 0 && Object.keys(engine.parts).length === 0
      ? await capturedPointIds(db, versionId)
      : null;
  const onPhoto = (name: string) => (photoPoints?.has(name.trim().toUpperCase()) ? name.trim().toUpperCase() : undefined);
  const redNet = resolveNet(engine, input.red) ?? onPhoto(input.red);
  if (!redNet) throw invalid('red', `Unknown net or test point "${input.red}" on this board model`);
  const blackNet = resolveNet(engine, input.black) ?? onPhoto(input.black);
  if (!blackNet) throw invalid('black', `Unknown net or test point "${input.black}" on this board model`);
  const lifted = resolveParts(engine, input.lifted);
  if ('unknown' in lifted) throw invalid('lifted', `Unknown part "${lifted.unknown}" on this board model`);
  const probe = { mode: input.mode, red: redNet, black: blackNet, power: input.power, lifted: lifted.parts };
  let alone: string | null = null;
  if (input.alone !== undefined) {
    const found = resolveAlone(engine, input.alone, probe);
    if ('refused' in found) throw invalid('alone', found.refused);
    alone = found.part;
  }

  let corrects: { mode: string; redNet: string; blackNet: string; power: string; lifted: string[]; authorId: string } | undefined;
  if (input.supersedes) {
    [corrects] = await q.corrects.execute({ id: input.supersedes, jobId });
    if (!corrects) throw invalid('supersedes', `No reading ${input.supersedes} on this job to correct`);
    // Separation of duties: someone else's reading is corrected only by the role the shop names (a lead by default).
    if (corrects.authorId !== actor.id) {
      const refused = correctionRefusal(await getDutyRules(db, actor.shopId), actor, corrects.authorId);
      if (refused) throw new AppError('forbidden', refused);
    }
  }
  const lift = { job: !!job?.guidedLiftedBy, trainee: actor.role === 'trainee' && (await traineeGuidedLifted(db, actor.id)) };
  if (job && guidedOrderBinds(actor.role, lift)) await checkGuidedStep({ db, job, input, probe: { redNet, blackNet, lifted: lifted.parts }, corrects });
  // Every role, every phase: an unpowered reading on the bus waits for the discharge gate.
  await checkSafetyGate(versionId, async () => (await loadVersion()).document, input);

  const engineValue = input.mode === 'continuity' ? (input.beep ?? input.value !== 'OL') : input.value;
  const meterOfJob = await meterRow;
  const meter = meterOf(jobMeter(meterOfJob?.job, meterOfJob?.shop).profile);
  const verdict = photoPoints ? null : verdictFor(engine, { ...probe, ...(alone ? { alone } : {}) }, engineValue, meter);
  const row: NewReading = {
    id: newId(),
    shopId: actor.shopId,
    jobId,
    idempotencyKey: input.idempotencyKey,
    requestHash: requestHashOf(input),
    mode: input.mode,
    red: input.red,
    black: input.black,
    redNet,
    blackNet,
    power: input.power,
    lifted: lifted.parts,
    alone,
    value: input.value === 'OL' ? null : input.value,
    overLimit: input.value === 'OL',
    unit: unitOf(input.mode),
    beep: input.beep ?? null,
    raw: input.raw,
    instrument: input.instrument ?? null,
    phase: input.phase,
    supersedes: input.supersedes ?? null,
    verdict,
    safetyBusVolts: input.safetyCheck?.busVolts ?? null,
    authorId: actor.id,
    takenAt: input.takenAt ? new Date(input.takenAt) : new Date(),
  };
  let inserted: ReadingRow | null;
  try {
    inserted = await insertReading(db, row);
  } catch (err) {
    if ((err as { code?: string }).code === '23505')
      throw new AppError('conflict', `Reading ${input.supersedes} is already corrected; correct the newer reading instead`);
    throw err;
  }
  // The answer is the row as stored; the author is the signed-in actor and nothing corrects it yet.
  if (inserted) return withVerdict(toReading(inserted, actor.name, null));
  return whyNotStored(db, actor, jobId, input);
}

/** Nothing was stored: the row a retry with this key stored first is the answer, or the job says why not. */
async function whyNotStored(db: Db, actor: Actor, jobId: string, input: CreateReadingInput): Promise<CreateReadingResponse> {
  const { job, replay } = await jobAndReplay(db, actor, jobId, input);
  if (replay) return replay;
  checkOpen(job.status, input.phase);
  // Open again by now (a review sent it back between the two looks): the client's retry will store it.
  throw new AppError('conflict', `Job ${jobId} changed while the reading was sent; send it again`);
}
