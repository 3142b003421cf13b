import { publicJobSchema } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getPublicJobQueryOptions } from './get-public-job';

export const decideQuote = (token: string, quoteId: string, decision: 'approve' | 'decline', reason?: string) =>
  api(`/public/links/${encodeURIComponent(token)}/quotes/${encodeURIComponent(quoteId)}/${decision}`, {
    method: 'POST',
    body: JSON.stringify(decision === 'decline' ? { reason: reason ?? '' } : {}),
    schema: publicJobSchema,
  });

export const useDecideQuote = (token: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (v: { quoteId: string; decision: 'approve' | 'decline'; reason?: string }) => decideQuote(token, v.quoteId, v.decision, v.reason),
    onSuccess: (data) => qc.setQueryData(getPublicJobQueryOptions(token).queryKey, data),
  });
};
