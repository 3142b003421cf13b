import { diagnosisResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The diagnosis engine's ranking and next tests for the job's current readings. */
export const getDiagnosis = (jobId: string) =>
  api(`/jobs/${encodeURIComponent(jobId)}/diagnosis`, { schema: diagnosisResponse });

export const getDiagnosisQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: ['jobs', jobId, 'diagnosis'], queryFn: () => getDiagnosis(jobId) });

export const useDiagnosis = (jobId: string, enabled = true) => useQuery({ ...getDiagnosisQueryOptions(jobId), enabled });
