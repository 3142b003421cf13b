import { jobBillingResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A job's quotes and invoices with their lines and the totals the server computed. */
export const getJobBilling = (jobId: string) => api(`/jobs/${encodeURIComponent(jobId)}/billing`, { schema: jobBillingResponse });

export const getJobBillingQueryOptions = (jobId: string) =>
  queryOptions({
    queryKey: ['job-billing', jobId],
    queryFn: () => getJobBilling(jobId),
    // the customer answers on their own page: poll gently so a sent quote's answer shows up without a reload
    refetchInterval: (q) =>
      q.state.data?.quotes.some((x) => x.status === 'sent') || q.state.data?.invoices.some((i) => i.status === 'issued') ? 10_000 : false,
  });

export const useJobBilling = (jobId: string) => useQuery(getJobBillingQueryOptions(jobId));
