import { boardDraftSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A board's capture draft (points, connectors and sections on its photo) with what the engine computed when it was saved. */
export const getDraft = (boardId: string) => api(`/boards/${encodeURIComponent(boardId)}/draft`, { schema: boardDraftSchema });
export const draftQueryOptions = (boardId: string) => queryOptions({ queryKey: ['boards', boardId, 'draft'], queryFn: () => getDraft(boardId) });
export const useDraft = (boardId: string) => useQuery(draftQueryOptions(boardId));
