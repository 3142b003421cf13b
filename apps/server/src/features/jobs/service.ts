import { and, asc, desc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import {
  allowedMoves,
  boardModelSchema,
  boardWords,
  wordsModelOf,
  guidedLiftRoles,
  guidedOrderBinds,
  METER_WORDS,
  readMeterProfileId,
  unprovenRows,
  verificationChecklist,
  type CreateJobRequest,
  type Job,
  type JobDetail,
  type JobStatus,
  type UpdateJobRequest,
} from '@splitscope/contract';
import { assertRole, type Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { getJobRow, type JobRow } from '../../db/job-row';
import { countingVerificationReadings } from '../../db/verification-readings';
import { boardModels, boardModelVersions, customers, diagnosisSnapshots, jobs, repairActions, reviews, shops, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { iso, isoOrNull } from '../../lib/dates';
import { newId } from '../../lib/ids';
import { getBoardVersion } from '../boards';
import { toCustomer } from '../customers';
import { computeDiagnosis, toSnapshot } from '../diagnosis';
import { jobMeterTable } from './meter-table';
import { toReview } from './review-view';
import { traineeGuidedLifted } from '../users';
import { checkMove, moveJob, type MoveRequest } from './flow';

const assignee = alias(users, 'assignee');

function jobQuery(db: Db) {
  return db
    .select({ j: jobs, customerName: customers.name, assigneeName: assignee.name, boardName: boardModels.name, boardVersion: boardModelVersions.version })
    .from(jobs)
    .innerJoin(customers, eq(customers.id, jobs.customerId))
    .innerJoin(boardModels, eq(boardModels.id, jobs.boardId))
    .innerJoin(boardModelVersions, eq(boardModelVersions.id, jobs.boardVersionId))
    .leftJoin(assignee, eq(assignee.id, jobs.assigneeId));
}

type JobQueryRow = Awaited<ReturnType<ReturnType<typeof jobQuery>['execute']>>[number];

const toJob = ({ j, customerName, assigneeName, boardName, boardVersion }: JobQueryRow): Job => ({
  id: j.id,
  shopId: j.shopId,
  number: j.number,
  customerId: j.customerId,
  customerName,
  unitDescription: j.unitDescription,
  serial: j.serial,
  unitSerial: j.unitSerial,
  boardId: j.boardId,
  boardName,
  boardVersionId: j.boardVersionId,
  boardVersion,
  faultCode: j.faultCode,
  symptom: j.symptom,
  status: j.status,
  sentBack: j.sentBack,
  proposedPart: j.proposedPart,
  proposalNote: j.proposalNote,
  assigneeId: j.assigneeId,
  assigneeName,
  priority: j.priority,
  receivedAt: iso(j.receivedAt),
  dueAt: isoOrNull(j.dueAt),
  closedAt: isoOrNull(j.closedAt),
  returnedVia: j.returnedVia === 'courier' || j.returnedVia === 'collected' ? j.returnedVia : null,
  guidedLifted: j.guidedLiftedBy !== null,
  meterProfile: readMeterProfileId(j.meterProfile),
  createdBy: j.createdBy,
  createdAt: iso(j.createdAt),
  updatedAt: iso(j.updatedAt),
});

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

export async function findJobs({
  db,
  actor,
  query,
}: {
  db: Db;
  actor: Actor;
  query: { status?: JobStatus[]; assignee?: string; customerId?: string; q?: string };
}) {
  const where: SQL[] = [eq(jobs.shopId, actor.shopId)];
  if (query.status?.length) where.push(inArray(jobs.status, query.status));
  if (query.assignee)
    where.push(query.assignee === 'none' ? sql`${jobs.assigneeId} is null` : eq(jobs.assigneeId, query.assignee === 'me' ? actor.id : query.assignee));
  if (query.customerId) where.push(eq(jobs.customerId, query.customerId));
  if (query.q) {
    const like = `%${escapeLike(query.q)}%`;
    where.push(
      or(
        ilike(jobs.unitDescription, like),
        ilike(jobs.serial, like),
        ilike(jobs.unitSerial, like),
        ilike(jobs.symptom, like),
        ilike(jobs.faultCode, like),
        ilike(customers.name, like),
        sql`${jobs.number}::text = ${query.q}`,
      )!,
    );
  }
  const priorityOrder = sql`case ${jobs.priority} when 'high' then 0 when 'normal' then 1 else 2 end`;
  const rows = await jobQuery(db)
    .where(and(...where))
    .orderBy(priorityOrder, asc(jobs.receivedAt));
  return { items: rows.map(toJob) };
}

export async function getJob({ db, shopId, id }: { db: Db; shopId: string; id: string }): Promise<Job> {
  const [row] = await jobQuery(db).where(and(eq(jobs.id, id), eq(jobs.shopId, shopId)));
  if (!row) throw new AppError('not_found', `No job ${id}`);
  return toJob(row);
}

export async function getJobDetail({ db, actor, id }: { db: Db; actor: Actor; id: string }): Promise<JobDetail> {
  const job = await getJob({ db, shopId: actor.shopId, id });
  const [customer] = await db.select().from(customers).where(eq(customers.id, job.customerId));
  const stored = await getBoardVersion({ db, shopId: actor.shopId, versionId: job.boardVersionId });
  const { meter, expectedReadings } = await jobMeterTable(db, job, stored);
  const board = { ...stored, expectedReadings };
  const reviewRows = await db
    .select({ r: reviews, name: users.name })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.reviewerId))
    .where(eq(reviews.jobId, id))
    .orderBy(asc(reviews.createdAt));
  const [snap] = await db.select().from(diagnosisSnapshots).where(eq(diagnosisSnapshots.jobId, id)).orderBy(desc(diagnosisSnapshots.createdAt)).limit(1);
  return {
    ...job,
    customer: toCustomer(customer!),
    board,
    meter,
    allowedTransitions: allowedMoves(job.status, actor.role),
    guidedOrderRequired: guidedOrderBinds(actor.role, {
      job: job.guidedLifted,
      trainee: actor.role === 'trainee' && (await traineeGuidedLifted(db, actor.id)),
    }),
    assigneeGuidedLifted: await assigneeLift(db, job.assigneeId),
    reviews: reviewRows.map(({ r, name }) => toReview(r, name)),
    latestSnapshot: snap ? toSnapshot(snap) : null,
  };
}

/** The assignee's lift across all their jobs, or null when the assignee is no trainee (guided order never binds them). */
async function assigneeLift(db: Db, assigneeId: string | null): Promise<boolean | null> {
  if (!assigneeId) return null;
  const [u] = await db.select({ role: users.role }).from(users).where(eq(users.id, assigneeId));
  return u?.role === 'trainee' ? traineeGuidedLifted(db, assigneeId) : null;
}

async function checkAssignee(db: Db, shopId: string, assigneeId: string | null | undefined) {
  if (!assigneeId) return;
  const [u] = await db
    .select({ id: users.id })
    .from(users)
    .where(and(eq(users.id, assigneeId), eq(users.shopId, shopId)));
  if (!u)
    throw new AppError('invalid', `No member ${assigneeId} in this shop to assign`, { errors: [{ path: 'assigneeId', message: 'not a member of this shop' }] });
}

export async function createJob({
  db,
  actor,
  input,
}: {
  db: Db;
  actor: Pick<Actor, 'id' | 'shopId'>;
  input: CreateJobRequest & { id?: string };
}): Promise<Job> {
  const key = input.idempotencyKey;
  const made = async () => {
    if (!key) return undefined;
    const [row] = await db
      .select({ id: jobs.id })
      .from(jobs)
      .where(and(eq(jobs.shopId, actor.shopId), eq(jobs.idempotencyKey, key)));
    return row ? getJob({ db, shopId: actor.shopId, id: row.id }) : undefined;
  };
  const earlier = await made();
  if (earlier) return earlier;
  try {
    return await insertJob({ db, actor, input });
  } catch (err) {
    // Two sends of one form at the same moment: the unique key lets one insert win; the other answers its job.
    const winner = await made();
    if (winner) return winner;
    throw err;
  }
}

async function insertJob({ db, actor, input }: { db: Db; actor: Pick<Actor, 'id' | 'shopId'>; input: CreateJobRequest & { id?: string } }): Promise<Job> {
  const [customer] = await db
    .select({ id: customers.id })
    .from(customers)
    .where(and(eq(customers.id, input.customerId), eq(customers.shopId, actor.shopId)));
  if (!customer) throw new AppError('invalid', `No customer ${input.customerId}`, { errors: [{ path: 'customerId', message: 'unknown customer' }] });
  const [board] = await db
    .select()
    .from(boardModels)
    .where(and(eq(boardModels.id, input.boardId), eq(boardModels.shopId, actor.shopId)));
  if (!board) throw new AppError('invalid', `No board model ${input.boardId}`, { errors: [{ path: 'boardId', message: 'unknown board model' }] });
  const [version] = await db
    .select({ id: boardModelVersions.id })
    .from(boardModelVersions)
    .where(and(eq(boardModelVersions.boardId, board.id), eq(boardModelVersions.version, input.boardVersion ?? board.currentVersion)));
  if (!version)
    throw new AppError('invalid', `Board model ${board.name} has no version ${input.boardVersion}`, {
      errors: [{ path: 'boardVersion', message: 'unknown version' }],
    });
  await checkAssignee(db, actor.shopId, input.assigneeId);
  const id = input.id ?? newId();
  await db.transaction(async (tx) => {
    // The shop's counter row is locked by the update, so two intakes never get the same number.
    const [shop] = await tx
      .update(shops)
      .set({ nextJobNumber: sql`${shops.nextJobNumber} + 1` })
      .where(eq(shops.id, actor.shopId))
      .returning({ taken: sql<number>`${shops.nextJobNumber} - 1` });
    await tx.insert(jobs).values({
      id,
      shopId: actor.shopId,
      number: Number(shop!.taken),
      customerId: customer.id,
      unitDescription: input.unitDescription,
      serial: input.serial ?? null,
      unitSerial: input.unitSerial ?? null,
      boardId: board.id,
      boardVersionId: version.id,
      faultCode: input.faultCode ?? null,
      symptom: input.symptom,
      priority: input.priority ?? 'normal',
      assigneeId: input.assigneeId ?? null,
      receivedAt: input.receivedAt ? new Date(input.receivedAt) : new Date(),
      dueAt: input.dueAt ? new Date(input.dueAt) : null,
      createdBy: actor.id,
      idempotencyKey: input.idempotencyKey ?? null,
      meterProfile: input.meterProfile ?? null,
    });
  });
  return getJob({ db, shopId: actor.shopId, id });
}

/**
 * What stands between a repaired job and its sign-off: the checklist rows (contract: verificationChecklist) that
 * no healthy verification reading (contract: verificationReadings) proves, or no repair.
 */
async function verificationProblems(db: Db, actor: Actor, job: JobRow): Promise<string | null> {
  const { repaired, rows } = await countingVerificationReadings(db, job.id);
  if (!repaired) return 'no repair action is recorded';
  const board = await getBoardVersion({ db, shopId: actor.shopId, versionId: job.boardVersionId });
  const parsed = boardModelSchema.safeParse(board.document);
  const m = parsed.success ? parsed.data : null;
  // The checklist's expected values are those the bench showed: computed for the job's meter.
  const { expectedReadings } = await jobMeterTable(db, job, board);
  const { rows: checklist } = verificationChecklist(m, expectedReadings, job.proposedPart);
  if (checklist.length === 0) return rows.length === 0 ? 'no verification readings were taken after the last repair action' : null;
  const netOf = (p: string) => m?.testPoints.find((t) => t.id.toLowerCase() === p.toLowerCase())?.net ?? p;
  const open = unprovenRows(checklist, rows, netOf);
  if (open.length === 0) return null;
  const words = boardWords(wordsModelOf(board.document));
  const state = (v: string | undefined) => (v === 'ok' ? 'healthy' : (v ?? 'no expected value'));
  const describe = ({ row, latest }: (typeof open)[number]) =>
    `${words.probe(row.red)} ${METER_WORDS[row.mode]} ${row.power === 'on' ? 'powered' : 'unplugged'} (${latest ? `read ${latest.raw}, ${state(latest.verdict?.verdict)}` : 'not measured'})`;
  return `${open.length} of ${checklist.length} checklist readings are not healthy yet: ${open.map(describe).join('; ')}`;
}

export async function updateJob({ db, actor, id, input }: { db: Db; actor: Actor; id: string; input: UpdateJobRequest }): Promise<Job> {
  const current = await getJobRow(db, actor.shopId, id);
  const { status, ...fields } = input;
  if (fields.assigneeId !== undefined) await checkAssignee(db, actor.shopId, fields.assigneeId);
  const set: Partial<typeof jobs.$inferInsert> = { updatedAt: new Date() };
  if (fields.assigneeId !== undefined) set.assigneeId = fields.assigneeId;
  if (fields.priority) set.priority = fields.priority;
  if (fields.unitDescription) set.unitDescription = fields.unitDescription;
  if (fields.serial !== undefined) set.serial = fields.serial;
  if (fields.unitSerial !== undefined) set.unitSerial = fields.unitSerial;
  if (fields.faultCode !== undefined) set.faultCode = fields.faultCode;
  if (fields.symptom) set.symptom = fields.symptom;
  if (fields.dueAt !== undefined) set.dueAt = fields.dueAt ? new Date(fields.dueAt) : null;
  if (fields.proposedPart !== undefined) set.proposedPart = fields.proposedPart;
  if (fields.proposalNote !== undefined) set.proposalNote = fields.proposalNote;
  if (fields.meterProfile !== undefined) set.meterProfile = fields.meterProfile;
  if (fields.guidedLifted !== undefined) {
    assertRole(actor, guidedLiftRoles, 'Lifting guided order');
    set.guidedLiftedBy = fields.guidedLifted ? actor.id : null;
  }

  let snapshot: typeof diagnosisSnapshots.$inferInsert | undefined;
  let move: MoveRequest | undefined;
  if (status && status !== current.status) {
    move = { jobId: id, shopId: actor.shopId, from: current.status, to: status, by: { actor, via: 'patch' }, set };
    checkMove(move);
    if (status === 'awaiting-review') {
      const part = fields.proposedPart ?? current.proposedPart;
      if (!part)
        throw new AppError('invalid', 'Name the part you propose (proposedPart) before asking for a review', {
          errors: [{ path: 'proposedPart', message: 'required to move to awaiting-review' }],
        });
      set.sentBack = false;
      const output = await computeDiagnosis({ db, job: current });
      snapshot = { id: newId(), shopId: actor.shopId, jobId: id, engineVersion: output.engineVersion, proposedPart: part, output, createdBy: actor.id };
    }
    if (status === 'repaired') {
      const [any] = await db.select({ id: repairActions.id }).from(repairActions).where(eq(repairActions.jobId, id)).limit(1);
      if (!any) throw new AppError('conflict', 'Record the repair action first (POST /api/jobs/:id/repairs)');
    }
    if (status === 'verified') {
      const problem = await verificationProblems(db, actor, current);
      if (problem) throw new AppError('conflict', `The repair cannot be signed off: ${problem}`);
      if (fields.functionalCheckDone !== true) {
        const message = 'Confirm the functional check (the board works powered and the fault does not return) before signing off';
        throw new AppError('invalid', message, { errors: [{ path: 'functionalCheckDone', message }] });
      }
      move.audit = { action: 'sign-off', detail: `job ${current.number}` };
    }
    if (status === 'returned') {
      if (!fields.returnedVia)
        throw new AppError('invalid', 'Say how the board left: sent by courier or collected by the customer', {
          errors: [{ path: 'returnedVia', message: 'choose courier or collected' }],
        });
      set.returnedVia = fields.returnedVia;
      set.closedAt = fields.returnedAt ? new Date(fields.returnedAt) : new Date();
    }
  }

  await db.transaction(async (tx) => {
    // Compare-and-set on the status we read, so two people moving the same job cannot both win.
    const done = move
      ? await moveJob(tx, move)
      : (
          await tx
            .update(jobs)
            .set(set)
            .where(and(eq(jobs.id, id), eq(jobs.status, current.status)))
            .returning({ id: jobs.id })
        ).length > 0;
    if (!done) throw new AppError('conflict', 'The job changed while you were editing it; reload and try again');
    if (snapshot) await tx.insert(diagnosisSnapshots).values(snapshot);
  });
  return getJob({ db, shopId: actor.shopId, id });
}
