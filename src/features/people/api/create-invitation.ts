import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { InvitationSummary, PersonRole } from '@shared/schemas/admin';
import { invitationsQueryKey } from '@/features/people/api/get-invitations';

export interface InvitationRequest {
  email: string;
  name: string;
  roles: PersonRole[];
  organisationId: string | null;
}

export async function createInvitation(request: InvitationRequest): Promise<InvitationSummary> {
  const body = await api.post<{ invitation: InvitationSummary }>('/api/invitations', request);
  return body.invitation;
}

export function useCreateInvitation({ onCreated }: { onCreated?: (invitation: InvitationSummary) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: async (invitation) => {
      await queryClient.invalidateQueries({ queryKey: invitationsQueryKey });
      onCreated?.(invitation);
    },
  });
}
