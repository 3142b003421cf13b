import { repairSchema, type CreateRepairRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const createRepair = (jobId: string, input: CreateRepairRequest) =>
  api(`/jobs/${encodeURIComponent(jobId)}/repairs`, { method: 'POST', body: JSON.stringify(input), schema: repairSchema });

export const useCreateRepair = (jobId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateRepairRequest) => createRepair(jobId, input),
    // A part fitted from the bin changed its stock too.
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: ['jobs', jobId] }), qc.invalidateQueries({ queryKey: ['parts-bin'] })]),
  });
};
