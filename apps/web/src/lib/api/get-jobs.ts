import { jobListResponse, type JobListQuery } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getJobs = (query: JobListQuery = {}) => {
  const qs = new URLSearchParams(Object.entries(query).filter(([, v]) => v !== undefined && v !== '') as [string, string][]);
  return api(`/jobs${qs.size ? `?${qs}` : ''}`, { schema: jobListResponse });
};

export const getJobsQueryOptions = (query: JobListQuery = {}) => queryOptions({ queryKey: ['jobs', 'list', query], queryFn: () => getJobs(query) });

export const useJobs = (query: JobListQuery = {}) => useQuery(getJobsQueryOptions(query));
