import { sentResponse, type SendRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getJobBillingQueryOptions } from './get-job-billing';

/** POST /quotes/:id/send or /invoices/:id/send: e-mails the document with a fresh customer link. */
export const sendDocument = (kind: 'quotes' | 'invoices', id: string, input: SendRequest) =>
  api(`/${kind}/${encodeURIComponent(id)}/send`, { method: 'POST', body: JSON.stringify(input), schema: sentResponse });

export const useSendDocument = (jobId: string, kind: 'quotes' | 'invoices') => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, to }: { id: string; to?: string }) => sendDocument(kind, id, to ? { to } : {}),
    onSuccess: () => qc.invalidateQueries({ queryKey: getJobBillingQueryOptions(jobId).queryKey }),
  });
};
