import { createInvitationResponse, type CreateInvitationRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getInvitationsQueryOptions } from './get-invitations';

export const useCreateInvitation = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationRequest) =>
      api('/users/invitations', { method: 'POST', body: JSON.stringify(input), schema: createInvitationResponse }),
    // Also after a mail failure: the invitation exists and can be resent.
    onSettled: () => qc.invalidateQueries(getInvitationsQueryOptions()),
  });
};
