import { shopSchema, type UpdateShopRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getShopQueryOptions } from './get-shop';

export const updateShop = (input: UpdateShopRequest) => api('/shop', { method: 'PATCH', body: JSON.stringify(input), schema: shopSchema });

export const useUpdateShop = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateShop,
    onSuccess: (data) => {
      qc.setQueryData(getShopQueryOptions().queryKey, data);
      void qc.invalidateQueries({ queryKey: ['me'] });
    },
  });
};
