import { boardDetailSchema, boardDraftSchema, type BoardCapture } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Saves the draft: the server composes it and computes the expected values; nothing is published. */
export const useSaveDraft = (boardId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (capture: BoardCapture) =>
      api(`/boards/${encodeURIComponent(boardId)}/draft`, { method: 'PUT', body: JSON.stringify({ capture }), schema: boardDraftSchema }),
    onSuccess: (d) => qc.setQueryData(['boards', boardId, 'draft'], d),
  });
};

/** Publishes the saved draft as the board's next version. */
export const usePublishDraft = (boardId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (note: string) =>
      api(`/boards/${encodeURIComponent(boardId)}/publish`, { method: 'POST', body: JSON.stringify({ note: note || undefined }), schema: boardDetailSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['boards'] }),
  });
};
