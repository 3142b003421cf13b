import { sentResponse, type SendRequest } from '@splitscope/contract';
import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A status e-mail for the job's current status, on demand (the automatic ones follow the settings). */
export const notifyCustomer = (jobId: string, input: SendRequest) =>
  api(`/jobs/${encodeURIComponent(jobId)}/notify`, { method: 'POST', body: JSON.stringify(input), schema: sentResponse });

export const useNotifyCustomer = (jobId: string) => useMutation({ mutationFn: (to?: string) => notifyCustomer(jobId, to ? { to } : {}) });
