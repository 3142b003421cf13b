import { customerListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getCustomers = () => api('/customers', { schema: customerListResponse });

export const getCustomersQueryOptions = () => queryOptions({ queryKey: ['customers'], queryFn: getCustomers, staleTime: 60_000 });

export const useCustomers = () => useQuery(getCustomersQueryOptions());
