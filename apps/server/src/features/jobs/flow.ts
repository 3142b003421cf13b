// Every change of a job's status goes through `moveJob`, checked against the contract's table of moves
// (packages/contract/src/policy.ts). The one exception is the statement that stores reading batches: it starts a
// received job's diagnosis itself, with the move it reads from the same table (readings/write-batch.ts).
import { and, eq } from 'drizzle-orm';
import { allowedMoves, jobMove, type JobStatus, type MoveEvent, type MoveVia } from '@splitscope/contract';
import { assertRole, type Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { auditLog, jobs } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import { priorsChanged } from '../../lib/priors-generation';

type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

const capitalised = (s: string) => s[0]!.toUpperCase() + s.slice(1);

/** The 409 for a move the table has not, or one asked for the wrong way; names where the job can go. */
function refuseMove(from: JobStatus, to: JobStatus, actor: Actor | undefined, via: MoveVia | MoveEvent): never {
  const viaPatch = actor ? allowedMoves(from, actor.role, 'patch') : [];
  const list = viaPatch.length ? viaPatch.join(', ') : 'nowhere by an edit';
  const move = jobMove(from, to);
  if (move?.via === 'review' && via === 'patch') {
    throw new AppError(
      'conflict',
      `${capitalised(move.name)} is a review decision: POST /api/jobs/:id/reviews. From ${from} an edit can move the job to: ${list}`,
      { allowed: viaPatch },
    );
  }
  throw new AppError('conflict', `A job cannot move from ${from} to ${to}. From ${from} it can move to: ${list}`, { allowed: viaPatch });
}

export interface MoveRequest {
  jobId: string;
  shopId: string;
  from: JobStatus;
  to: JobStatus;
  /** Asked for by someone (an edit or a review), checked against the move's roles; or made by an event. */
  by: { actor: Actor; via: MoveVia } | { event: MoveEvent };
  /** Other columns written in the same statement (the proposed part, the sent-back flag, …). */
  set?: Partial<typeof jobs.$inferInsert>;
  /** An audit entry to write with the move; events always get one naming the event. */
  audit?: { action: string; detail: string };
}

/** Checks a move against the table without writing: for services that have more to check before they write. */
export function checkMove({ from, to, by }: Pick<MoveRequest, 'from' | 'to' | 'by'>): void {
  const move = jobMove(from, to);
  if ('event' in by) {
    if (!move?.events?.includes(by.event)) refuseMove(from, to, undefined, by.event);
    return;
  }
  if (!move || move.via !== by.via) refuseMove(from, to, by.actor, by.via);
  assertRole(by.actor, move.roles, capitalised(move.name));
}

/**
 * Moves a job from `from` to `to`, as a compare-and-set on `from`: false when the job is no longer there (someone
 * moved it meanwhile), so two people moving the same job cannot both win. Run it inside the caller's transaction
 * when other rows change with the move.
 */
export async function moveJob(db: Db | Tx, req: MoveRequest): Promise<boolean> {
  checkMove(req);
  const now = new Date();
  const set: Partial<typeof jobs.$inferInsert> = { ...req.set, status: req.to, updatedAt: now };
  // A returned board keeps the day it left, when the request names one.
  if (req.to === 'returned') set.closedAt ??= now;
  const moved = await db
    .update(jobs)
    .set(set)
    .where(and(eq(jobs.id, req.jobId), eq(jobs.shopId, req.shopId), eq(jobs.status, req.from)))
    .returning({ id: jobs.id });
  if (moved.length === 0) return false;
  // a verified or returned job joins the shop's repair history, which steers other jobs' priors
  if (req.to === 'verified' || req.to === 'returned') priorsChanged();
  const audit = req.audit ?? ('event' in req.by ? { action: 'job.status', detail: `${req.from} → ${req.to} (${req.by.event})` } : undefined);
  if (audit) {
    const userId = 'actor' in req.by ? req.by.actor.id : null;
    await db.insert(auditLog).values({ id: newId(), shopId: req.shopId, userId, action: audit.action, subject: req.jobId, detail: audit.detail });
  }
  return true;
}
