import { jobSchema, type UpdateJobRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const updateJob = (id: string, input: UpdateJobRequest) =>
  api(`/jobs/${encodeURIComponent(id)}`, { method: 'PATCH', body: JSON.stringify(input), schema: jobSchema });

/** Status changes and the proposed part; refreshes the job and every job list. */
export const useUpdateJob = (id: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateJobRequest) => updateJob(id, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['jobs'] }),
  });
};
