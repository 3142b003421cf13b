import { reviewSchema, type CreateReviewRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A lead approves the proposed part or sends the diagnosis back with a comment. */
export const createReview = (jobId: string, input: CreateReviewRequest) =>
  api(`/jobs/${encodeURIComponent(jobId)}/reviews`, { method: 'POST', body: JSON.stringify(input), schema: reviewSchema });

export const useCreateReview = (jobId: string) => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (input: CreateReviewRequest) => createReview(jobId, input), onSuccess: () => qc.invalidateQueries({ queryKey: ['jobs'] }) });
};
