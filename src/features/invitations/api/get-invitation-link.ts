import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InvitationLinkView } from '@shared/schemas/admin';

export async function getInvitationLink(token: string): Promise<InvitationLinkView> {
  const body = await api.get<{ invitation: InvitationLinkView }>(`/api/invitation-links/${encodeURIComponent(token)}`);
  return body.invitation;
}

export function useInvitationLink(token: string) {
  return useQuery(queryOptions({ queryKey: ['invitation-link', token], queryFn: () => getInvitationLink(token), retry: false }));
}
