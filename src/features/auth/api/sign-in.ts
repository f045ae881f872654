import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { invariant } from '@/lib/invariant';
import type { User } from '@/types/api';
import { currentUserQueryKey } from '@/features/auth/api/get-current-user';

export interface SignInInput {
  email: string;
  password: string;
}

export async function signIn(input: SignInInput): Promise<User> {
  const body = await api.post<{ user: User }>('/api/auth/sign-in', input);
  invariant(body && typeof body.user === 'object', 'POST /api/auth/sign-in answered 2xx without { user }');
  return body.user;
}

export interface UseSignInOptions {
  onSignedIn?: (user: User) => void;
}

export function useSignIn({ onSignedIn }: UseSignInOptions = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    meta: { unauthorisedIsAnAnswer: true },
    onSuccess: (user) => {
      // Nothing cached for a previous person may leak into this session.
      queryClient.clear();
      queryClient.setQueryData(currentUserQueryKey, user);
      onSignedIn?.(user);
    },
  });
}
