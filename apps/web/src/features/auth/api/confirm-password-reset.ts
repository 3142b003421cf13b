import type { PasswordResetConfirm } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const useConfirmPasswordReset = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: PasswordResetConfirm) => api('/auth/password-reset/confirm', { method: 'POST', body: JSON.stringify(input) }),
    onSuccess: () => qc.invalidateQueries(),
  });
};
