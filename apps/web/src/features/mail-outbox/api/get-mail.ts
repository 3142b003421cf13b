import { capturedMailListResponse, capturedMailSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getMailList = () => api('/dev/mail', { schema: capturedMailListResponse });
export const getMailListQueryOptions = () => queryOptions({ queryKey: ['dev-mail'], queryFn: getMailList, refetchInterval: 5000 });
export const useMailList = () => useQuery(getMailListQueryOptions());

export const getMail = (id: string) => api(`/dev/mail/${encodeURIComponent(id)}`, { schema: capturedMailSchema });
export const getMailQueryOptions = (id: string) => queryOptions({ queryKey: ['dev-mail', id], queryFn: () => getMail(id), staleTime: Infinity });
export const useMail = (id: string | null) => useQuery({ ...getMailQueryOptions(id ?? ''), enabled: !!id });
