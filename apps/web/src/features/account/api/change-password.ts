import type { ChangePasswordRequest } from '@splitscope/contract';
import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The other sessions end; this browser gets a new session cookie. */
export const useChangePassword = () =>
  useMutation({ mutationFn: (input: ChangePasswordRequest) => api('/me/password', { method: 'POST', body: JSON.stringify(input) }) });
