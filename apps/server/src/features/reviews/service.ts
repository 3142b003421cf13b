import { and, asc, desc, eq } from 'drizzle-orm';
import type { Review } from '@splitscope/contract';
import type { Actor } from '../../auth/guards';
import type { Db } from '../../db/client';
import { auditLog, diagnosisSnapshots, jobs, reviews, users } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import { getJobRow } from '../jobs/service';
import { toReview } from './view';

/** Approve → approved; send back → diagnosing, marked sent back. Only from awaiting review. */
export async function createReview({ db, actor, jobId, input }: { db: Db; actor: Actor; jobId: string; input: { decision: 'approve' | 'send-back'; comment: string; proposedPart?: string | null } }): Promise<Review> {
  const job = await getJobRow(db, actor.shopId, jobId);
  if (job.status !== 'awaiting-review') throw new AppError('conflict', `Only a job awaiting review can be reviewed; this job is ${job.status}`, { allowed: [] });
  const [snap] = await db.select({ id: diagnosisSnapshots.id }).from(diagnosisSnapshots).where(eq(diagnosisSnapshots.jobId, jobId)).orderBy(desc(diagnosisSnapshots.createdAt)).limit(1);
  const part = input.proposedPart ?? job.proposedPart;
  const id = newId();
  await db.transaction(async (tx) => {
    const next = input.decision === 'approve' ? { status: 'approved' as const, proposedPart: part } : { status: 'diagnosing' as const, sentBack: true };
    const done = await tx
      .update(jobs)
      .set({ ...next, updatedAt: new Date() })
      .where(and(eq(jobs.id, jobId), eq(jobs.status, 'awaiting-review')))
      .returning({ id: jobs.id });
    if (done.length === 0) throw new AppError('conflict', 'Someone reviewed this job a moment ago; reload it');
    await tx.insert(reviews).values({ id, shopId: actor.shopId, jobId, reviewerId: actor.id, decision: input.decision, comment: input.comment, proposedPart: part, snapshotId: snap?.id ?? null });
    await tx.insert(auditLog).values({ id: newId(), shopId: actor.shopId, userId: actor.id, action: input.decision === 'approve' ? 'approval' : 'sent-back', subject: jobId, detail: `job ${job.number}: ${part ?? 'no part'}` });
  });
  const [row] = await db.select({ r: reviews, name: users.name }).from(reviews).innerJoin(users, eq(users.id, reviews.reviewerId)).where(eq(reviews.id, id));
  return toReview(row!.r, row!.name);
}

export async function findReviews({ db, shopId, jobId }: { db: Db; shopId: string; jobId: string }) {
  await getJobRow(db, shopId, jobId);
  const rows = await db.select({ r: reviews, name: users.name }).from(reviews).innerJoin(users, eq(users.id, reviews.reviewerId)).where(eq(reviews.jobId, jobId)).orderBy(asc(reviews.createdAt));
  return { items: rows.map(({ r, name }) => toReview(r, name)) };
}
