import { readingListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A job's readings, oldest first, with the server's verdict on each. */
export const getReadings = (jobId: string) => api(`/jobs/${encodeURIComponent(jobId)}/readings`, { schema: readingListResponse });

export const getReadingsQueryOptions = (jobId: string) => queryOptions({ queryKey: ['jobs', jobId, 'readings'], queryFn: () => getReadings(jobId) });

export const useReadings = (jobId: string) => useQuery(getReadingsQueryOptions(jobId));
