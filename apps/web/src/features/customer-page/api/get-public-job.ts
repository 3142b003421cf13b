import { publicJobSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiError } from '@/lib/api-client';

export const getPublicJob = (token: string) => api(`/public/links/${encodeURIComponent(token)}`, { schema: publicJobSchema });

export const getPublicJobQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['public-job', token],
    queryFn: () => getPublicJob(token),
    // a dead link stays dead; do not retry it
    retry: (count, err) => !(err instanceof ApiError && err.status === 404) && count < 2,
  });

/** `awaitingPayment`: back from the checkout, poll until the payment webhook has marked the invoice paid. */
export const usePublicJob = (token: string, awaitingPayment = false) =>
  useQuery({
    ...getPublicJobQueryOptions(token),
    refetchInterval: (q) => (awaitingPayment && q.state.data?.invoices.some((i) => i.status === 'issued') ? 2000 : false),
  });
