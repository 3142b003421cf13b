import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The two links that let a person choose a password: an invitation, and a reset. Both sign the person in. */
export type PasswordLink = 'invitation' | 'reset';

const PATHS: Record<PasswordLink, (token: string, password: string) => [string, object]> = {
  invitation: (token, password) => ['/auth/accept-invitation', { token, password }],
  reset: (token, password) => ['/auth/password-reset/confirm', { token, password }],
};

export const useSetPasswordFromLink = (link: PasswordLink) => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ token, password }: { token: string; password: string }) => {
      const [path, body] = PATHS[link](token, password);
      return api(path, { method: 'POST', body: JSON.stringify(body) });
    },
    onSuccess: () => qc.invalidateQueries(),
  });
};
