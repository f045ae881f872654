import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, isUnauthorisedError } from '@/lib/api-client';
import { currentUserQueryKey } from '@/features/auth/api/get-current-user';

export async function signOut(): Promise<void> {
  try {
    await api.post<void>('/api/auth/sign-out');
  } catch (error) {
    // Already signed out (session expired): the goal is reached.
    if (!isUnauthorisedError(error)) throw error;
  }
}

export interface UseSignOutOptions {
  onSignedOut?: () => void;
}

export function useSignOut({ onSignedOut }: UseSignOutOptions = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => {
      queryClient.clear();
      queryClient.setQueryData(currentUserQueryKey, null);
      onSignedOut?.();
    },
  });
}
