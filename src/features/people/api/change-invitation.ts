import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InvitationSummary } from '@shared/schemas/admin';
import { invitationsQueryKey } from '@/features/people/api/get-invitations';

export type InvitationChange = 'revoke' | 'resend';

/** Withdraws an invitation, or sends a fresh link (the old one stops working). */
export async function changeInvitation(invitationId: string, change: InvitationChange): Promise<InvitationSummary> {
  const body = await api.post<{ invitation: InvitationSummary }>(`/api/invitations/${encodeURIComponent(invitationId)}/${change}`);
  return body.invitation;
}

export function useChangeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ invitationId, change }: { invitationId: string; change: InvitationChange }) => changeInvitation(invitationId, change),
    onSettled: () => queryClient.invalidateQueries({ queryKey: invitationsQueryKey }),
  });
}
