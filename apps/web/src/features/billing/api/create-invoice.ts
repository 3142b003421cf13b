import { invoiceSchema, type CreateInvoiceRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getJobBillingQueryOptions } from './get-job-billing';

/** Issues the invoice of a verified job: from the approved quote, or from lines typed here. */
export const createInvoice = (jobId: string, input: CreateInvoiceRequest) =>
  api(`/jobs/${encodeURIComponent(jobId)}/invoices`, { method: 'POST', body: JSON.stringify(input), schema: invoiceSchema });

export const useCreateInvoice = (jobId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvoiceRequest) => createInvoice(jobId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: getJobBillingQueryOptions(jobId).queryKey }),
  });
};
