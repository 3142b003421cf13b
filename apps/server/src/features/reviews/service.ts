import { asc, desc, eq } from 'drizzle-orm';
import { approvalRefusal, type Review } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { diagnosisSnapshots, reviews, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import { getDutyRules } from '../duties';
import { getJobRow } from '../../db/job-row';
import { checkMove, moveJob, toReview, type MoveRequest } from '../jobs';

/** Approve → approved; send back → diagnosing, marked sent back. Only from awaiting review. */
export async function createReview({
  db,
  actor,
  jobId,
  input,
}: {
  db: Db;
  actor: Actor;
  jobId: string;
  input: { decision: 'approve' | 'send-back'; comment: string; proposedPart?: string | null };
}): Promise<Review> {
  const job = await getJobRow(db, actor.shopId, jobId);
  if (job.status !== 'awaiting-review')
    throw new AppError('conflict', `Only a job awaiting review can be reviewed; this job is ${job.status}`, { allowed: [] });
  const part = input.proposedPart ?? job.proposedPart;
  const move: MoveRequest = {
    jobId,
    shopId: actor.shopId,
    from: job.status,
    ...(input.decision === 'approve' ? { to: 'approved', set: { proposedPart: part } } : { to: 'diagnosing', set: { sentBack: true } }),
    by: { actor, via: 'review' },
    audit: { action: input.decision === 'approve' ? 'approval' : 'sent-back', detail: `job ${job.number}: ${part ?? 'no part'}` },
  };
  checkMove(move);
  // The latest snapshot is the proposal under review; who stored it proposed it.
  const [snap] = await db
    .select({ id: diagnosisSnapshots.id, proposer: diagnosisSnapshots.createdBy })
    .from(diagnosisSnapshots)
    .where(eq(diagnosisSnapshots.jobId, jobId))
    .orderBy(desc(diagnosisSnapshots.createdAt))
    .limit(1);
  if (input.decision === 'approve') {
    const refused = approvalRefusal(await getDutyRules(db, actor.shopId), actor.id, snap?.proposer ?? null);
    if (refused) throw new AppError('forbidden', refused);
  }
  const id = newId();
  await db.transaction(async (tx) => {
    if (!(await moveJob(tx, move))) throw new AppError('conflict', 'Someone reviewed this job a moment ago; reload it');
    await tx.insert(reviews).values({
      id,
      shopId: actor.shopId,
      jobId,
      reviewerId: actor.id,
      decision: input.decision,
      comment: input.comment,
      proposedPart: part,
      snapshotId: snap?.id ?? null,
    });
  });
  const [row] = await db.select({ r: reviews, name: users.name }).from(reviews).innerJoin(users, eq(users.id, reviews.reviewerId)).where(eq(reviews.id, id));
  return toReview(row!.r, row!.name);
}

export async function findReviews({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }) {
  await getJobRow(db, shopId, jobId);
  const rows = await db
    .select({ r: reviews, name: users.name })
    .from(reviews)
    .innerJoin(users, eq(users.id, reviews.reviewerId))
    .where(eq(reviews.jobId, jobId))
    .orderBy(asc(reviews.createdAt));
  return { items: rows.map(({ r, name }) => toReview(r, name)) };
}
