// A review as the API shows it; the job detail lists a job's reviews, and the reviews feature answers with one.
import type { Review } from '@splitscope/contract';
import type { reviews } from '../../db/schema';
import { iso } from '../../lib/dates';

export const toReview = (r: typeof reviews.$inferSelect, reviewerName: string): Review => ({
  id: r.id,
  jobId: r.jobId,
  reviewerId: r.reviewerId,
  reviewerName,
  decision: r.decision,
  comment: r.comment,
  proposedPart: r.proposedPart,
  snapshotId: r.snapshotId,
  createdAt: iso(r.createdAt),
});
