import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InvitationState, InvitationSummary } from '@shared/schemas/admin';

export const invitationsQueryKey = ['invitations'] as const;

export async function getInvitations(state: InvitationState | ''): Promise<InvitationSummary[]> {
  const body = await api.get<{ items: InvitationSummary[] }>(`/api/invitations${state ? `?state=${state}` : ''}`);
  return body.items;
}

export function getInvitationsQueryOptions(state: InvitationState | '') {
  return queryOptions({ queryKey: [...invitationsQueryKey, state], queryFn: () => getInvitations(state) });
}

export function useInvitations(state: InvitationState | '') {
  return useQuery(getInvitationsQueryOptions(state));
}
