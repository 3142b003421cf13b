import { quoteSchema, type CreateQuoteRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getJobBillingQueryOptions } from './get-job-billing';

export const createQuote = (jobId: string, input: CreateQuoteRequest) =>
  api(`/jobs/${encodeURIComponent(jobId)}/quotes`, { method: 'POST', body: JSON.stringify(input), schema: quoteSchema });

export const updateQuote = (quoteId: string, input: CreateQuoteRequest) =>
  api(`/quotes/${encodeURIComponent(quoteId)}`, { method: 'PATCH', body: JSON.stringify(input), schema: quoteSchema });

/** Creates a draft quote, or replaces a draft's lines, rate and note; the server prices it. */
export const useSaveQuote = (jobId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ quoteId, input }: { quoteId: string | null; input: CreateQuoteRequest }) =>
      quoteId ? updateQuote(quoteId, input) : createQuote(jobId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: getJobBillingQueryOptions(jobId).queryKey }),
  });
};
