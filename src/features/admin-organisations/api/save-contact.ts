import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrganisationContact } from '@shared/schemas/admin';
import { adminOrganisationsQueryKey } from '@/features/admin-organisations/api/get-organisations';

export interface ContactRequest {
  name: string;
  email: string;
  position: string | null;
  phone: string | null;
  receivesCertificates: boolean;
}

/** Adds a contact (no contactId) or replaces one's details. */
export async function saveContact(args: { organisationId: string; contactId: string | null; contact: ContactRequest }): Promise<OrganisationContact> {
  const base = `/api/organisations/${encodeURIComponent(args.organisationId)}/contacts`;
  const body = args.contactId
    ? await api.put<{ contact: OrganisationContact }>(`${base}/${encodeURIComponent(args.contactId)}`, args.contact)
    : await api.post<{ contact: OrganisationContact }>(base, args.contact);
  return body.contact;
}

export function useSaveContact({ onSaved }: { onSaved?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveContact,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: adminOrganisationsQueryKey });
      onSaved?.();
    },
  });
}
