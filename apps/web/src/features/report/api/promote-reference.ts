import { boardReferencesResponse } from '@splitscope/contract';
import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A signed-off repair's verification readings become a known-good reference of its board model. */
export const usePromoteReference = (jobId: string) =>
  useMutation({
    mutationFn: (note: string | null) =>
      api(`/jobs/${encodeURIComponent(jobId)}/reference`, { method: 'POST', body: JSON.stringify({ note }), schema: boardReferencesResponse }),
  });
