import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface OrganisationChoice {
  id: string;
  name: string;
  kind: 'lab' | 'client';
}

export async function getOrganisationChoices(): Promise<OrganisationChoice[]> {
  const body = await api.get<{ items: OrganisationChoice[] }>('/api/organisations');
  return body.items;
}

export function useOrganisationChoices() {
  return useQuery(queryOptions({ queryKey: ['organisations', 'choices'], queryFn: getOrganisationChoices }));
}
