import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrganisationDetail } from '@shared/schemas/admin';
import { adminOrganisationsQueryKey } from '@/features/admin-organisations/api/get-organisations';

/** Creates a client organisation (no id) or renames one. */
export async function saveOrganisation({ organisationId, name }: { organisationId: string | null; name: string }): Promise<OrganisationDetail> {
  const body = organisationId
    ? await api.patch<{ organisation: OrganisationDetail }>(`/api/organisations/${encodeURIComponent(organisationId)}`, { name })
    : await api.post<{ organisation: OrganisationDetail }>('/api/organisations', { name });
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
