import { jobSchema, type CreateJobRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const createJob = (input: CreateJobRequest) => api('/jobs', { method: 'POST', body: JSON.stringify(input), schema: jobSchema });

export const useCreateJob = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createJob, onSuccess: () => qc.invalidateQueries({ queryKey: ['jobs', 'list'] }) });
};
