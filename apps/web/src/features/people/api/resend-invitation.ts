import { createInvitationResponse } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getInvitationsQueryOptions } from './get-invitations';

export const useResendInvitation = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api(`/users/invitations/${encodeURIComponent(id)}/resend`, { method: 'POST', schema: createInvitationResponse }),
    onSettled: () => qc.invalidateQueries(getInvitationsQueryOptions()),
  });
};
