import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const useSignOutEverywhere = () => {
  const qc = useQueryClient();
  return useMutation({ mutationFn: () => api('/auth/sign-out-everywhere', { method: 'POST' }), onSuccess: () => qc.clear() });
};
