import { jobDetailSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** One job with its customer, pinned board model, reviews and the latest diagnosis snapshot. */
export const getJob = (id: string) => api(`/jobs/${encodeURIComponent(id)}`, { schema: jobDetailSchema });

export const getJobQueryOptions = (id: string) => queryOptions({ queryKey: ['jobs', id], queryFn: () => getJob(id) });

export const useJob = (id: string) => useQuery(getJobQueryOptions(id));
