import { binPartListResponse, binPartSchema, quoteDraftResponse, type BinPartInput } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The drawers of the parts bin (the repair form picks from them; the bin page stocks them). */
export const partsBinQueryOptions = () => queryOptions({ queryKey: ['parts-bin'], queryFn: () => api('/parts-bin', { schema: binPartListResponse }) });
export const usePartsBin = () => useQuery(partsBinQueryOptions());

export const useStockBinPart = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: BinPartInput) => api('/parts-bin', { method: 'POST', body: JSON.stringify(input), schema: binPartSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['parts-bin'] }),
  });
};

export const useUpdateBinPart = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: Partial<BinPartInput> & { id: string }) =>
      api(`/parts-bin/${encodeURIComponent(id)}`, { method: 'PATCH', body: JSON.stringify(input), schema: binPartSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['parts-bin'] }),
  });
};

/** Quote lines pre-filled from the parts the job's repairs took from the bin and the shop's labour rate. */
export const useQuoteDraft = (jobId: string, enabled: boolean) =>
  useQuery(
    queryOptions({
      queryKey: ['jobs', jobId, 'quote-draft'],
      queryFn: () => api(`/jobs/${encodeURIComponent(jobId)}/quote-draft`, { schema: quoteDraftResponse }),
      enabled,
    }),
  );
