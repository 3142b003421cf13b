import type { PasswordResetRequest } from '@splitscope/contract';
import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const useRequestPasswordReset = () =>
  useMutation({ mutationFn: (input: PasswordResetRequest) => api('/auth/password-reset', { method: 'POST', body: JSON.stringify(input) }) });
