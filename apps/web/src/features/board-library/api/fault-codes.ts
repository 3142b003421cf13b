import { faultCodeListResponse, faultCodeSchema, type CreateFaultCodeRequest, type UpdateFaultCodeRequest } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The shop's fault-code table for a board model (the board's own codes and the shop-wide ones). */
export const getBoardFaultCodesQueryOptions = (boardId: string) =>
  queryOptions({
    queryKey: ['fault-codes', boardId],
    queryFn: () => api(`/fault-codes?boardId=${encodeURIComponent(boardId)}`, { schema: faultCodeListResponse }),
  });
export const useBoardFaultCodes = (boardId: string) => useQuery(getBoardFaultCodesQueryOptions(boardId));

export const useSaveFaultCode = (boardId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string | null; input: UpdateFaultCodeRequest }) =>
      id
        ? api(`/fault-codes/${encodeURIComponent(id)}`, { method: 'PUT', body: JSON.stringify(input), schema: faultCodeSchema })
        : api('/fault-codes', { method: 'POST', body: JSON.stringify({ ...input, boardId } satisfies CreateFaultCodeRequest), schema: faultCodeSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['fault-codes', boardId] }),
  });
};
