import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { AdminPersonSummary, PersonRole } from '@shared/schemas/admin';
import { peopleQueryKey } from '@/features/people/api/get-people';

export async function changePersonRoles(personId: string, roles: PersonRole[]): Promise<AdminPersonSummary> {
  const body = await api.put<{ person: AdminPersonSummary }>(`/api/people/${encodeURIComponent(personId)}/roles`, { roles });
  return body.person;
}

export function useChangePersonRoles() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ personId, roles }: { personId: string; roles: PersonRole[] }) => changePersonRoles(personId, roles),
    onSettled: () => queryClient.invalidateQueries({ queryKey: peopleQueryKey }),
  });
}
