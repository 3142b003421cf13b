import { and, asc, eq, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { CreateReadingInput, CreateReadingResponse, ReadingVerdict, StoredReading } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { boardModelVersions, jobs, readings, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { boardEngine, powerRefusal, resolveNet, resolveParts, unitOf, verdictFor } from '../boards/engine';
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

async function getStored(db: Db, jobId: string, key: string) {
  const [x] = await rowsQuery(db).where(and(eq(readings.jobId, jobId), eq(readings.idempotencyKey, key)));
  return x ? withVerdict(toReading(x.r, x.authorName, x.supersededBy)) : null;
}

const invalid = (path: string, message: string) => new AppError('invalid', message, { errors: [{ path, message }] });

/**
 * Stores one reading with its verdict. A retry with the same idempotency key answers the stored row and
 * stores nothing; a correction is a new row naming the one it supersedes.
 */
export async function createReading({ db, actor, jobId, input }: { db: Db; actor: Actor; jobId: string; input: CreateReadingInput }): Promise<CreateReadingResponse> {
  const job = await getJobRow(db, actor.shopId, jobId);
  if (actor.role === 'trainee' && job.assigneeId !== actor.id) throw new AppError('forbidden', 'Trainees record readings only on jobs assigned to them');
  if (actor.role === 'trainee' && input.phase !== 'diagnosis') throw new AppError('forbidden', 'Trainees take diagnosis steps; verification readings after a repair are taken by a technician');
  const stored = await getStored(db, jobId, input.idempotencyKey);
  if (stored) return stored;

  const allowed = input.phase === 'verification' ? ['approved', 'repaired'] : ['received', 'diagnosing'];
  if (!allowed.includes(job.status)) {
    throw new AppError('conflict', `A ${input.phase} reading is taken while the job is ${allowed.join(' or ')}; this job is ${job.status}`);
  }
  const why = powerRefusal(input.mode, input.power);
  if (why) throw invalid('power', why);
  if (input.value !== 'OL' && input.mode === 'ohm' && input.value < 0) throw invalid('value', `A resistance cannot be negative (${input.value} ohm)`);

  const [version] = await db.select().from(boardModelVersions).where(eq(boardModelVersions.id, job.boardVersionId));
  const engine = boardEngine(version!.id, version!.document);
  const redNet = resolveNet(engine, input.red);
  if (!redNet) throw invalid('red', `Unknown net or test point "${input.red}" on this board model`);
  const blackNet = resolveNet(engine, input.black);
  if (!blackNet) throw invalid('black', `Unknown net or test point "${input.black}" on this board model`);
  const lifted = resolveParts(engine, input.lifted);
  if ('unknown' in lifted) throw invalid('lifted', `Unknown part "${lifted.unknown}" on this board model`);

  let corrects: { mode: string; redNet: string; blackNet: string; power: string; lifted: string[] } | undefined;
  if (input.supersedes) {
    [corrects] = await db.select({ mode: readings.mode, redNet: readings.redNet, blackNet: readings.blackNet, power: readings.power, lifted: readings.lifted }).from(readings).where(and(eq(readings.id, input.supersedes), eq(readings.jobId, jobId)));
    if (!corrects) throw invalid('supersedes', `No reading ${input.supersedes} on this job to correct`);
  }
  if (actor.role === 'trainee') {
    await checkGuidedStep({ db, job, input, probe: { redNet, blackNet, lifted: lifted.parts }, corrects });
    checkSafetyGate(version!.document, input);
  }

  const engineValue = input.mode === 'continuity' ? (input.beep ?? input.value !== 'OL') : input.value;
  const verdict = verdictFor(engine, { mode: input.mode, red: redNet, black: blackNet, power: input.power, lifted: lifted.parts }, engineValue);
  try {
    await db.transaction(async (tx) => {
      await tx
        .insert(readings)
        .values({
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
        })
        .onConflictDoNothing({ target: [readings.jobId, readings.idempotencyKey] });
      // The first reading starts the diagnosis.
      if (job.status === 'received') await tx.update(jobs).set({ status: 'diagnosing', updatedAt: new Date() }).where(and(eq(jobs.id, jobId), eq(jobs.status, 'received')));
    });
  } catch (err) {
    if ((err as { code?: string }).code === '23505') throw new AppError('conflict', `Reading ${input.supersedes} is already corrected; correct the newer reading instead`);
    throw err;
  }
  return (await getStored(db, jobId, input.idempotencyKey))!;
}
