import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { Person } from '@/types/api';

export const peopleQueryKey = ['people'] as const;

export async function getPeople(): Promise<Person[]> {
  const body = await api.get<{ people: Person[] }>('/api/people');
  return body.people;
}

export function getPeopleQueryOptions() {
  return queryOptions({ queryKey: peopleQueryKey, queryFn: getPeople });
}

export function usePeople() {
  return useQuery(getPeopleQueryOptions());
}
