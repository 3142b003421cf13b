import { benchMeterArmSchema, benchMeterStatusResponse, type ArmBenchMeterRequest, type BenchMeterStatus } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

const path = (jobId: string) => `/jobs/${encodeURIComponent(jobId)}/bench-meter`;
const key = (jobId: string) => ['jobs', jobId, 'bench-meter'] as const;

const shown = (s: BenchMeterStatus | undefined) => (s?.arm ? `${s.arm.id}:${s.arm.state}:${s.arm.ready}` : 'none');

/**
 * This person's bench-meter request on the job and their bridge. While a request waits, each poll is held by the
 * server until the request changes (up to 10 s), so a reading shows the moment it is stored; otherwise a plain
 * poll every 10 s keeps "connected" current.
 */
export const useBenchMeter = (jobId: string, enabled: boolean) => {
  const qc = useQueryClient();
  return useQuery({
    ...queryOptions({
      queryKey: key(jobId),
      queryFn: ({ signal }) => {
        const before = qc.getQueryData<BenchMeterStatus>(key(jobId));
        const hold = before?.arm?.state === 'waiting' ? `?wait=10&since=${encodeURIComponent(shown(before))}` : '';
        return api(`${path(jobId)}${hold}`, { schema: benchMeterStatusResponse, signal });
      },
    }),
    enabled,
    refetchInterval: (q) => (q.state.data?.arm?.state === 'waiting' ? 50 : 10_000),
  });
};

export const useArmBenchMeter = (jobId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ArmBenchMeterRequest) => api(path(jobId), { method: 'POST', body: JSON.stringify(body), schema: benchMeterArmSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: key(jobId) }),
  });
};

export const useCancelBenchMeter = (jobId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api(path(jobId), { method: 'DELETE', schema: benchMeterStatusResponse }),
    onSuccess: (data) => qc.setQueryData(key(jobId), data),
  });
};
