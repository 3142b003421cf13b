import { z } from 'zod';
import { idSchema, isoDateTime, optionalText } from './common';

export const reviewDecisions = ['approve', 'send-back'] as const;
export const reviewDecisionSchema = z.enum(reviewDecisions);
export type ReviewDecision = z.infer<typeof reviewDecisionSchema>;

export const createReviewRequest = z
  .object({
    decision: reviewDecisionSchema,
    comment: z.string().trim().max(4000).default(''),
    /** The part the reviewer agrees with (approve) or suggests instead; defaults to the technician's proposal. */
    proposedPart: optionalText(50),
  })
  .refine((r) => r.decision !== 'send-back' || r.comment.length > 0, {
    path: ['comment'],
    message: 'say why the diagnosis is sent back',
  });
export type CreateReviewRequest = z.input<typeof createReviewRequest>;

export const reviewSchema = z.object({
  id: idSchema,
  jobId: idSchema,
  reviewerId: idSchema,
  reviewerName: z.string(),
  decision: reviewDecisionSchema,
  comment: z.string(),
  proposedPart: z.string().nullable(),
  snapshotId: idSchema.nullable(),
  createdAt: isoDateTime,
});
export type Review = z.infer<typeof reviewSchema>;
export const reviewListResponse = z.object({ items: z.array(reviewSchema) });
export type ReviewList = z.infer<typeof reviewListResponse>;
