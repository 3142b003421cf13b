import type { FirstRunRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Creates the shop and its first admin; the admin is signed in afterwards. */
export const useFirstRun = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: FirstRunRequest) => api('/setup', { method: 'POST', body: JSON.stringify(input) }),
    onSuccess: () => qc.invalidateQueries(),
  });
};
