import { repairReportSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getReport = (jobId: string) => api(`/jobs/${encodeURIComponent(jobId)}/report`, { schema: repairReportSchema });
export const getReportQueryOptions = (jobId: string) => queryOptions({ queryKey: ['jobs', jobId, 'report'], queryFn: () => getReport(jobId) });
export const useReport = (jobId: string) => useQuery(getReportQueryOptions(jobId));
