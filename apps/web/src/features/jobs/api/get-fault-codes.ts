import { faultCodeListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The fault-code table for a board (its family's codes); each code names the suspect sections. */
export const getFaultCodes = (boardId: string) => api(`/fault-codes?boardId=${encodeURIComponent(boardId)}`, { schema: faultCodeListResponse });

export const getFaultCodesQueryOptions = (boardId: string) =>
  queryOptions({ queryKey: ['fault-codes', boardId], queryFn: () => getFaultCodes(boardId), staleTime: 60_000 });

export const useFaultCodes = (boardId: string | undefined) => useQuery({ ...getFaultCodesQueryOptions(boardId ?? ''), enabled: !!boardId });
