import { benchMeterArmSchema, benchMeterStatusResponse, type ArmBenchMeterRequest } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

const path = (jobId: string) => `/jobs/${encodeURIComponent(jobId)}/bench-meter`;
const key = (jobId: string) => ['jobs', jobId, 'bench-meter'] as const;

/**
 * This person's bench-meter request on the job and their bridge. Polled fast (150 ms) while a request waits, so a
 * reading shows within a second of the meter's trigger; slowly otherwise, to keep "connected" current.
 */
export const useBenchMeter = (jobId: string, enabled: boolean) =>
  useQuery({
    ...queryOptions({ queryKey: key(jobId), queryFn: () => api(path(jobId), { schema: benchMeterStatusResponse }) }),
    enabled,
    refetchInterval: (q) => (q.state.data?.arm?.state === 'waiting' ? 150 : 10_000),
  });

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
