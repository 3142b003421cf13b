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

export const usePublicJob = (token: string, opts: { pollMs?: number } = {}) =>
  useQuery({ ...getPublicJobQueryOptions(token), refetchInterval: opts.pollMs ?? false });
