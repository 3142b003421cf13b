import { setupStatusResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Demo or a real shop, and whether the first-run page is still open. */
export const setupStatusQueryOptions = () =>
  queryOptions({ queryKey: ['setup-status'], queryFn: () => api('/setup', { schema: setupStatusResponse }), staleTime: 5 * 60_000 });

export const useSetupStatus = () => useQuery(setupStatusQueryOptions());
