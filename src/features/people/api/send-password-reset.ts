import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export async function sendPasswordReset(personId: string): Promise<string> {
  const body = await api.post<{ message: string }>(`/api/people/${encodeURIComponent(personId)}/password-reset`);
  return body.message;
}

export function useSendPasswordReset() {
  return useMutation({ mutationFn: (personId: string) => sendPasswordReset(personId) });
}
