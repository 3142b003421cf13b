import { sessionResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The signed-in user, or null when signed out. */
export const meQueryOptions = () =>
  queryOptions({
    queryKey: ['me'],
    queryFn: async () => (await api('/auth/session', { schema: sessionResponse })).user,
    staleTime: 60_000,
  });

export const useMe = () => useQuery(meQueryOptions());
