import { shopSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getShopQueryOptions = () => queryOptions({ queryKey: ['shop'], queryFn: () => api('/shop', { schema: shopSchema }), staleTime: 60_000 });

export const useShop = () => useQuery(getShopQueryOptions());
