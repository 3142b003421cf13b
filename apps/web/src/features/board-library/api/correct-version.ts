import { boardDetailSchema, type CorrectBoardVersionRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Stores a lead's corrected form of a version whose stored model the schema rejects (that version, in place). */
export const useCorrectVersion = (versionId: string) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CorrectBoardVersionRequest) =>
      api(`/boards/versions/${encodeURIComponent(versionId)}/document`, { method: 'PUT', body: JSON.stringify(input), schema: boardDetailSchema }),
    // Jobs pinned to the version read it again: their readings are judged from now on.
    onSuccess: () => Promise.all([qc.invalidateQueries({ queryKey: ['boards'] }), qc.invalidateQueries({ queryKey: ['jobs'] })]),
  });
};
