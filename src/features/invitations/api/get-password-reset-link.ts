import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PasswordResetLinkView } from '@shared/schemas/admin';

export async function getPasswordResetLink(token: string): Promise<PasswordResetLinkView> {
  const body = await api.get<{ passwordReset: PasswordResetLinkView }>(`/api/password-reset-links/${encodeURIComponent(token)}`);
  return body.passwordReset;
}

export function usePasswordResetLink(token: string) {
  return useQuery(queryOptions({ queryKey: ['password-reset-link', token], queryFn: () => getPasswordResetLink(token), retry: false }));
}
