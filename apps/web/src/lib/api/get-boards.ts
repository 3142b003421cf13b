import { boardListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getBoards = () => api('/boards', { schema: boardListResponse });

export const getBoardsQueryOptions = () => queryOptions({ queryKey: ['boards'], queryFn: getBoards, staleTime: 60_000 });

export const useBoards = () => useQuery(getBoardsQueryOptions());
