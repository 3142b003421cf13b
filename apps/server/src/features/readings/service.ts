import { and, asc, eq, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { CreateReadingInput, CreateReadingResponse, ReadingVerdict, StoredReading } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { boardModelVersions, jobs, readings, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { boardEngine, cachedBoardEngine, powerRefusal, resolveNet, resolveParts, unitOf, verdictFor } from '../boards/engine';
import { getJobRow } from '../jobs/service';
import { checkGuidedStep, checkSafetyGate } from './guided';

type Row = typeof readings.$inferSelect;
const later = alias(readings, 'later');

function toReading(r: Row, authorName: string, supersededBy: string | null): StoredReading {
  return {
    id: r.id,
    jobId: r.jobId,
    mode: r.mode,
    red: r.red,
    black: r.black,
    redNet: r.redNet,
    blackNet: r.blackNet,
    power: r.power,
    lifted: r.lifted,
    value: r.overLimit ? 'OL' : r.value!,
    unit: r.unit as 'V' | 'ohm',
    beep: r.beep,
    raw: r.raw,
    instrument: r.instrument,
    phase: r.phase,
    idempotencyKey: r.idempotencyKey,
    supersedes: r.supersedes,
    supersededBy,
    authorId: r.authorId,
    authorName,
    takenAt: iso(r.takenAt),
    createdAt: iso(r.createdAt),
    verdict: (r.verdict as ReadingVerdict | null) ?? null,
    safetyBusVolts: r.safetyBusVolts,
  };
}

function rowsQuery(db: Db) {
  return db
    .select({ r: readings, authorName: users.name, supersededBy: later.id })
    .from(readings)
    .innerJoin(users, eq(users.id, readings.authorId))
    .leftJoin(later, eq(later.supersedes, readings.id));
}

/** The full history (or only current rows), oldest first. */
export async function findReadings({ db, shopId, jobId, view, phase }: { db: Db; shopId: string; jobId: string; view: 'all' | 'current'; phase?: 'diagnosis' | 'verification' }) {
  await getJobRow(db, shopId, jobId);
  const where = [eq(readings.jobId, jobId)];
  if (phase) where.push(eq(readings.phase, phase));
  if (view === 'current') where.push(sql`${later.id} is null`);
  const rows = await rowsQuery(db).where(and(...where)).orderBy(asc(readings.takenAt), asc(readings.createdAt));
  return { items: rows.map((x) => toReading(x.r, x.authorName, x.supersededBy)) };
}

const withVerdict = (r: StoredReading): CreateReadingResponse => ({ ...r, expected: r.verdict?.expected ?? null, low: r.verdict?.low ?? null, high: r.verdict?.high ?? null });

const p = sql.placeholder;
const stored = alias(readings, 'stored');

// The write path's statements, built once per database handle and named so pg parses each once per connection:
// a reading write is a few round trips, not a few query builds and round trips.
const prepared = new WeakMap<Db, ReturnType<typeof prepare>>();
function prepare(db: Db) {
  return {
    // The job (of this shop only) and, in the same round trip, the row a retry with this key already stored.
    jobAndReplay: db
      .select({ job: { id: jobs.id, status: jobs.status, assigneeId: jobs.assigneeId, boardVersionId: jobs.boardVersionId }, r: stored, authorName: users.name, supersededBy: later.id })
      .from(jobs)
      .leftJoin(stored, and(eq(stored.jobId, jobs.id), eq(stored.idempotencyKey, p('key'))))
      .leftJoin(users, eq(users.id, stored.authorId))
      .leftJoin(later, eq(later.supersedes, stored.id))
      .where(and(eq(jobs.id, p('jobId')), eq(jobs.shopId, p('shopId'))))
      .prepare('reading_job_and_replay'),
    replay: rowsQuery(db).where(and(eq(readings.jobId, p('jobId')), eq(readings.idempotencyKey, p('key')))).prepare('reading_replay'),
    document: db.select({ document: boardModelVersions.document }).from(boardModelVersions).where(eq(boardModelVersions.id, p('versionId'))).prepare('reading_board_document'),
    corrects: db
      .select({ mode: readings.mode, redNet: readings.redNet, blackNet: readings.blackNet, power: readings.power, lifted: readings.lifted })
      .from(readings)
      .where(and(eq(readings.id, p('id')), eq(readings.jobId, p('jobId'))))
      .prepare('reading_corrects'),
    insert: db
      .insert(readings)
      .values({
        id: p('id'), shopId: p('shopId'), jobId: p('jobId'), idempotencyKey: p('idempotencyKey'), mode: p('mode'), red: p('red'), black: p('black'),
        redNet: p('redNet'), blackNet: p('blackNet'), power: p('power'), lifted: p('lifted'), value: p('value'), overLimit: p('overLimit'),
        unit: p('unit'), beep: p('beep'), raw: p('raw'), instrument: p('instrument'), phase: p('phase'), supersedes: p('supersedes'),
        // Raw, not through the jsonb encoder, which would store a missing verdict as JSON null instead of SQL null.
        verdict: sql`${p('verdict')}`,
        safetyBusVolts: p('safetyBusVolts'), authorId: p('authorId'), takenAt: p('takenAt'),
      })
      .onConflictDoNothing({ target: [readings.jobId, readings.idempotencyKey] })
      .returning()
      .prepare('reading_insert'),
  };
}
function queries(db: Db) {
  let q = prepared.get(db);
  if (!q) prepared.set(db, (q = prepare(db)));
  return q;
}

async function getStored(db: Db, jobId: string, key: string) {
  const [x] = await queries(db).replay.execute({ jobId, key });
  return x ? withVerdict(toReading(x.r, x.authorName, x.supersededBy)) : null;
}

const invalid = (path: string, message: string) => new AppError('invalid', message, { errors: [{ path, message }] });

/**
 * Stores one reading with its verdict. A retry with the same idempotency key answers the stored row and
 * stores nothing; a correction is a new row naming the one it supersedes.
 */
export async function createReading({ db, actor, jobId, input }: { db: Db; actor: Actor; jobId: string; input: CreateReadingInput }): Promise<CreateReadingResponse> {
  const q = queries(db);
  const [found] = await q.jobAndReplay.execute({ jobId, shopId: actor.shopId, key: input.idempotencyKey });
  if (!found) throw new AppError('not_found', `No job ${jobId}`);
  const { job } = found;
  if (actor.role === 'trainee' && job.assigneeId !== actor.id) throw new AppError('forbidden', 'Trainees record readings only on jobs assigned to them');
  if (actor.role === 'trainee' && input.phase !== 'diagnosis') throw new AppError('forbidden', 'Trainees take diagnosis steps; verification readings after a repair are taken by a technician');
  if (found.r) return withVerdict(toReading(found.r, found.authorName!, found.supersededBy));

  const allowed = input.phase === 'verification' ? ['approved', 'repaired'] : ['received', 'diagnosing'];
  if (!allowed.includes(job.status)) {
    throw new AppError('conflict', `A ${input.phase} reading is taken while the job is ${allowed.join(' or ')}; this job is ${job.status}`);
  }
  const why = powerRefusal(input.mode, input.power);
  if (why) throw invalid('power', why);
  if (input.value !== 'OL' && input.mode === 'ohm' && input.value < 0) throw invalid('value', `A resistance cannot be negative (${input.value} ohm)`);

  // A version never changes, so its document is loaded only to build the engine once, or for the safety gate.
  let document: unknown;
  const loadDocument = async () => (document ??= (await q.document.execute({ versionId: job.boardVersionId }))[0]!.document);
  const engine = cachedBoardEngine(job.boardVersionId) ?? boardEngine(job.boardVersionId, await loadDocument());
  const redNet = resolveNet(engine, input.red);
  if (!redNet) throw invalid('red', `Unknown net or test point "${input.red}" on this board model`);
  const blackNet = resolveNet(engine, input.black);
  if (!blackNet) throw invalid('black', `Unknown net or test point "${input.black}" on this board model`);
  const lifted = resolveParts(engine, input.lifted);
  if ('unknown' in lifted) throw invalid('lifted', `Unknown part "${lifted.unknown}" on this board model`);

  let corrects: { mode: string; redNet: string; blackNet: string; power: string; lifted: string[] } | undefined;
  if (input.supersedes) {
    [corrects] = await q.corrects.execute({ id: input.supersedes, jobId });
    if (!corrects) throw invalid('supersedes', `No reading ${input.supersedes} on this job to correct`);
  }
  if (actor.role === 'trainee') {
    await checkGuidedStep({ db, job, input, probe: { redNet, blackNet, lifted: lifted.parts }, corrects });
    checkSafetyGate(await loadDocument(), input);
  }

  const engineValue = input.mode === 'continuity' ? (input.beep ?? input.value !== 'OL') : input.value;
  const verdict = verdictFor(engine, { mode: input.mode, red: redNet, black: blackNet, power: input.power, lifted: lifted.parts }, engineValue);
  const row = {
    id: newId(),
    shopId: actor.shopId,
    jobId,
    idempotencyKey: input.idempotencyKey,
    mode: input.mode,
    red: input.red,
    black: input.black,
    redNet,
    blackNet,
    power: input.power,
    lifted: lifted.parts,
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
  let inserted: Row | undefined;
  try {
    if (job.status === 'received') {
      // The first reading starts the diagnosis, in the same transaction as the row.
      await db.transaction(async (tx) => {
        [inserted] = await tx.insert(readings).values(row).onConflictDoNothing({ target: [readings.jobId, readings.idempotencyKey] }).returning();
        await tx.update(jobs).set({ status: 'diagnosing', updatedAt: new Date() }).where(and(eq(jobs.id, jobId), eq(jobs.status, 'received')));
      });
    } else {
      [inserted] = await q.insert.execute({ ...row, verdict: verdict === null ? null : JSON.stringify(verdict) });
    }
  } catch (err) {
    if ((err as { code?: string }).code === '23505') throw new AppError('conflict', `Reading ${input.supersedes} is already corrected; correct the newer reading instead`);
    throw err;
  }
  // Nothing inserted: a concurrent retry with the same key stored its row first, and that row is the answer.
  // Otherwise the answer is the row as stored; the author is the signed-in actor and nothing corrects it yet.
  return inserted ? withVerdict(toReading(inserted, actor.name, null)) : (await getStored(db, jobId, input.idempotencyKey))!;
}
