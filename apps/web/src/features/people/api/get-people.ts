import { userListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getPeopleQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: () => api('/users', { schema: userListResponse }) });

export const usePeople = () => useQuery(getPeopleQueryOptions());
