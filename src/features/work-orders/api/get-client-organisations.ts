import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrganisationSummary } from '@shared/schemas/work-orders';

export const clientOrganisationsQueryKey = ['organisations', 'client'] as const;

export async function getClientOrganisations(signal?: AbortSignal): Promise<OrganisationSummary[]> {
  const body = await api.get<{ items: OrganisationSummary[] }>('/api/organisations?kind=client', { signal });
  return [...body.items].sort((a, b) => a.name.localeCompare(b.name));
}

export function getClientOrganisationsQueryOptions() {
  return queryOptions({
    queryKey: clientOrganisationsQueryKey,
    queryFn: ({ signal }) => getClientOrganisations(signal),
    staleTime: 5 * 60_000,
  });
}

/** Only lab staff may list clients; pass `enabled: false` for a client's own sign-in. */
export function useClientOrganisations({ enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getClientOrganisationsQueryOptions(), enabled });
}
