import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { adminOrganisationsQueryKey } from '@/features/admin-organisations/api/get-organisations';

export async function deleteContact({ organisationId, contactId }: { organisationId: string; contactId: string }): Promise<void> {
  await api.delete(`/api/organisations/${encodeURIComponent(organisationId)}/contacts/${encodeURIComponent(contactId)}`);
}

export function useDeleteContact() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: deleteContact, onSettled: () => queryClient.invalidateQueries({ queryKey: adminOrganisationsQueryKey }) });
}
