import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { AdminPersonSummary } from '@shared/schemas/admin';
import { peopleQueryKey } from '@/features/people/api/get-people';

export async function setPersonActive(personId: string, active: boolean): Promise<AdminPersonSummary> {
  const body = await api.post<{ person: AdminPersonSummary }>(`/api/people/${encodeURIComponent(personId)}/${active ? 'reactivate' : 'deactivate'}`);
  return body.person;
}

export function useSetPersonActive() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ personId, active }: { personId: string; active: boolean }) => setPersonActive(personId, active),
    onSettled: () => queryClient.invalidateQueries({ queryKey: peopleQueryKey }),
  });
}
