import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrganisationDetail } from '@shared/schemas/admin';
import { adminOrganisationsQueryKey } from '@/features/admin-organisations/api/get-organisations';

export async function getOrganisation(organisationId: string): Promise<OrganisationDetail> {
  const body = await api.get<{ organisation: OrganisationDetail }>(`/api/organisations/${encodeURIComponent(organisationId)}`);
  return body.organisation;
}

export function useOrganisation(organisationId: string | null) {
  return useQuery(
    queryOptions({
      queryKey: [...adminOrganisationsQueryKey, 'detail', organisationId],
      queryFn: () => getOrganisation(organisationId!),
      enabled: organisationId !== null,
    }),
  );
}
