import { meterImportResponse, meterProfileListResponse, meterProfileSchema, type MeterImportRequest, type MeterProfileInput } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const useMeterProfiles = () =>
  useQuery(queryOptions({ queryKey: ['meter-profiles'], queryFn: () => api('/meter-profiles', { schema: meterProfileListResponse }) }));

export const useSaveMeterProfile = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: MeterProfileInput) => api('/meter-profiles', { method: 'PUT', body: JSON.stringify(input), schema: meterProfileSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['meter-profiles'] }),
  });
};

/** Preview (stores nothing) or import (stores the good rows once per import key). */
export const useMeterImport = (jobId: string, mode: 'preview' | 'import') => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: MeterImportRequest) =>
      api(`/jobs/${encodeURIComponent(jobId)}/meter-import${mode === 'preview' ? '/preview' : ''}`, {
        method: 'POST',
        body: JSON.stringify(input),
        schema: meterImportResponse,
      }),
    onSuccess: () => (mode === 'import' ? qc.invalidateQueries({ queryKey: ['jobs', jobId] }) : undefined),
  });
};
