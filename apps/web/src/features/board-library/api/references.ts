import { boardReferencesResponse, type CreateReferenceSetRequest } from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

const path = (boardId: string) => `/boards/${encodeURIComponent(boardId)}/references`;

/** The board model's known-good reference sets and each point's bands from the model, the good boards and a published source. */
export const getReferencesQueryOptions = (boardId: string) =>
  queryOptions({ queryKey: ['boards', boardId, 'references'], queryFn: () => api(path(boardId), { schema: boardReferencesResponse }) });
export const useReferences = (boardId: string) => useQuery(getReferencesQueryOptions(boardId));

export const useRecordReference = (boardId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateReferenceSetRequest) => api(path(boardId), { method: 'POST', body: JSON.stringify(input), schema: boardReferencesResponse }),
    onSuccess: (data) => qc.setQueryData(['boards', boardId, 'references'], data),
  });
};
