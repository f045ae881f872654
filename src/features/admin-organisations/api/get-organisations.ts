import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrganisationWithCounts } from '@shared/schemas/admin';

export const adminOrganisationsQueryKey = ['organisations', 'admin'] as const;

export async function getOrganisationsWithCounts(): Promise<OrganisationWithCounts[]> {
  const body = await api.get<{ items: OrganisationWithCounts[] }>('/api/organisations?include=counts');
  return body.items;
}

export function useOrganisationsWithCounts() {
  return useQuery(queryOptions({ queryKey: [...adminOrganisationsQueryKey, 'list'], queryFn: getOrganisationsWithCounts }));
}
