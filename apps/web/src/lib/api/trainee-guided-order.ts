import { shopMemberSchema } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** A lead lifts (or restores) guided order for a trainee on all of that trainee's jobs; every job view refreshes. */
export const useTraineeGuidedOrder = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, lifted }: { id: string; lifted: boolean }) =>
      api(`/users/${encodeURIComponent(id)}/guided-order`, { method: 'PUT', body: JSON.stringify({ lifted }), schema: shopMemberSchema }),
    // The jobs' own records carry the lift (guidedOrderRequired, assigneeGuidedLifted); their readings and
    // diagnosis do not change, so they are not fetched again.
    onSettled: () =>
      Promise.all([qc.invalidateQueries({ queryKey: ['jobs'], predicate: (q) => q.queryKey.length === 2 }), qc.invalidateQueries({ queryKey: ['users'] })]),
  });
};
