import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PeoplePage, PersonRole } from '@shared/schemas/admin';

export const peopleQueryKey = ['people'] as const;

export interface PeopleFilters {
  q: string;
  role: PersonRole | '';
  active: 'true' | 'false' | '';
  page: number;
  pageSize: number;
}

export async function getPeople(filters: PeopleFilters): Promise<PeoplePage> {
  const params = new URLSearchParams({ page: String(filters.page), pageSize: String(filters.pageSize) });
  if (filters.q.trim()) params.set('q', filters.q.trim());
  if (filters.role) params.set('role', filters.role);
  if (filters.active) params.set('active', filters.active);
  return api.get<PeoplePage>(`/api/people?${params}`);
}

export function getPeopleQueryOptions(filters: PeopleFilters) {
  return queryOptions({ queryKey: [...peopleQueryKey, filters], queryFn: () => getPeople(filters), placeholderData: keepPreviousData });
}

export function usePeople(filters: PeopleFilters) {
  return useQuery(getPeopleQueryOptions(filters));
}
