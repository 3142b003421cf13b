import { diagnosisResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The diagnosis engine's ranking and next tests for the job's current readings. */
export const getDiagnosis = (jobId: string) => api(`/jobs/${encodeURIComponent(jobId)}/diagnosis`, { schema: diagnosisResponse });

export const getDiagnosisQueryOptions = (jobId: string) => queryOptions({ queryKey: ['jobs', jobId, 'diagnosis'], queryFn: () => getDiagnosis(jobId) });

/**
 * While the board's expected values are still being prepared, or fault pairs are still being checked, the
 * ranking is asked for again each second so it updates when they arrive.
 */
export const useDiagnosis = (jobId: string, enabled = true) =>
  useQuery({ ...getDiagnosisQueryOptions(jobId), enabled, refetchInterval: (q) => (q.state.data?.preparing || q.state.data?.checking ? 1000 : false) });
