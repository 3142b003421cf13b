import { invitationListResponse } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const getInvitationsQueryOptions = () =>
  queryOptions({ queryKey: ['invitations'], queryFn: () => api('/users/invitations', { schema: invitationListResponse }) });

export const useInvitations = () => useQuery(getInvitationsQueryOptions());
