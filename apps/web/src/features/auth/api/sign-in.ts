import type { SignInRequest } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { meQueryOptions } from '@/lib/api/me';

export const useSignIn = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: SignInRequest) => api('/auth/sign-in', { method: 'POST', body: JSON.stringify(input) }),
    onSuccess: () => qc.invalidateQueries(meQueryOptions()),
  });
};

export const useSignOut = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api('/auth/sign-out', { method: 'POST' }),
    onSuccess: () => {
      qc.clear();
    },
  });
};
