import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { User } from '@/types/api';

export type LinkKind = 'invitation' | 'password-reset';

/** Accepts an invitation or completes a password reset; either way the server signs this browser in. */
export async function submitLinkPassword(kind: LinkKind, token: string, password: string): Promise<User> {
  const path = kind === 'invitation' ? '/api/invitation-links/' : '/api/password-reset-links/';
  const body = await api.post<{ user: User }>(`${path}${encodeURIComponent(token)}`, { password });
  return body.user;
}

export function useChoosePassword(kind: LinkKind, token: string, { onDone }: { onDone: (user: User) => void }) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (password: string) => submitLinkPassword(kind, token, password),
    onSuccess: async (user) => {
      // The session changed: every cached answer belonged to the previous one.
      queryClient.clear();
      onDone(user);
    },
  });
}
