import { repairListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getRepairs = (jobId: string) => api(`/jobs/${encodeURIComponent(jobId)}/repairs`, { schema: repairListResponse });
export const getRepairsQueryOptions = (jobId: string) => queryOptions({ queryKey: ['jobs', jobId, 'repairs'], queryFn: () => getRepairs(jobId) });
export const useRepairs = (jobId: string) => useQuery(getRepairsQueryOptions(jobId));
