import { userListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getUsers = () => api('/users', { schema: userListResponse });

export const getUsersQueryOptions = () => queryOptions({ queryKey: ['users'], queryFn: getUsers, staleTime: 60_000 });

export const useUsers = () => useQuery(getUsersQueryOptions());
