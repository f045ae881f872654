import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrganisationDetail } from '@shared/schemas/admin';

export interface OrganisationFields {
  name: string;
  /** One line per line; left out: unchanged. */
  postalAddress?: string;
  email?: string | null;
  phone?: string | null;
}

/** Creates a client organisation (no id) or changes one's name, address, e-mail and phone. */
export async function saveOrganisation({ organisationId, ...fields }: { organisationId: string | null } & OrganisationFields): Promise<OrganisationDetail> {
  const body = organisationId
    ? await api.patch<{ organisation: OrganisationDetail }>(`/api/organisations/${encodeURIComponent(organisationId)}`, fields)
    : await api.post<{ organisation: OrganisationDetail }>('/api/organisations', fields);
  return body.organisation;
}

export function useSaveOrganisation({ onSaved }: { onSaved?: (organisation: OrganisationDetail) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: saveOrganisation,
    onSuccess: async (organisation) => {
      await queryClient.invalidateQueries({ queryKey: ['organisations'] });
      onSaved?.(organisation);
    },
  });
}
