import { boardDetailSchema, type UpdateBoardRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Saves a new version of the board model; the answer carries the recomputed expected-readings table. */
export const updateBoard = (id: string, input: UpdateBoardRequest) =>
  api(`/boards/${encodeURIComponent(id)}`, { method: 'PATCH', body: JSON.stringify(input), schema: boardDetailSchema });

export const useUpdateBoard = (id: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateBoardRequest) => updateBoard(id, input),
    onSuccess: (data) => {
      qc.setQueryData(['boards', id], data);
      return qc.invalidateQueries({ queryKey: ['boards'] });
    },
  });
};
