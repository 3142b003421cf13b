import type { AcceptInvitationRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const useAcceptInvitation = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationRequest) => api('/auth/accept-invitation', { method: 'POST', body: JSON.stringify(input) }),
    onSuccess: () => qc.invalidateQueries(),
  });
};
