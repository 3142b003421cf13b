import { serviceTermsSchema, type UpdateServiceTermsRequest } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The shop's warranty days and labour rate (the parts bin's quote pre-fill and the settings page read them). */
export const serviceTermsQueryOptions = () =>
  queryOptions({ queryKey: ['service-terms'], queryFn: () => api('/service-terms', { schema: serviceTermsSchema }) });
export const useServiceTerms = () => useQuery(serviceTermsQueryOptions());

export const useUpdateServiceTerms = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateServiceTermsRequest) => api('/service-terms', { method: 'PATCH', body: JSON.stringify(input), schema: serviceTermsSchema }),
    onSuccess: (data) => qc.setQueryData(serviceTermsQueryOptions().queryKey, data),
  });
};
