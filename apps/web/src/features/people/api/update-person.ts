import { shopMemberSchema, type Role } from '@splitscope/contract';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { getPeopleQueryOptions } from './get-people';

export const useUpdatePerson = () => {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: { id: string; role?: Role; active?: boolean }) =>
      api(`/users/${encodeURIComponent(id)}`, { method: 'PATCH', body: JSON.stringify(input), schema: shopMemberSchema }),
    onSettled: () => qc.invalidateQueries(getPeopleQueryOptions()),
  });
};
