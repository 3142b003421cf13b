import { billingSettingsSchema, type UpdateBillingSettingsRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getBillingSettingsQueryOptions } from './get-billing-settings';

export const updateBillingSettings = (input: UpdateBillingSettingsRequest) =>
  api('/billing/settings', { method: 'PATCH', body: JSON.stringify(input), schema: billingSettingsSchema });

export const useUpdateBillingSettings = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateBillingSettings,
    onSuccess: (data) => qc.setQueryData(getBillingSettingsQueryOptions().queryKey, data),
  });
};
