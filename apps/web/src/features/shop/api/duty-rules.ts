import { dutyRulesSchema, type UpdateDutyRulesRequest } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

const dutyRulesQueryOptions = () => queryOptions({ queryKey: ['shop', 'duties'], queryFn: () => api('/shop/duties', { schema: dutyRulesSchema }) });

export const useDutyRules = () => useQuery(dutyRulesQueryOptions());

export const useUpdateDutyRules = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateDutyRulesRequest) => api('/shop/duties', { method: 'PATCH', body: JSON.stringify(input), schema: dutyRulesSchema }),
    onSuccess: (data) => qc.setQueryData(dutyRulesQueryOptions().queryKey, data),
  });
};
