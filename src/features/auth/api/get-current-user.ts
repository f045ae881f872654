import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isUnauthorisedError } from '@/lib/api-client';
import { invariant } from '@/lib/invariant';
import type { User } from '@/types/api';

export const currentUserQueryKey = ['auth', 'current-user'] as const;

/** The signed-in person, or null when nobody is signed in (the server's 401). */
export async function getCurrentUser(): Promise<User | null> {
  try {
    const body = await api.get<{ user: User }>('/api/auth/me');
    invariant(body && typeof body.user === 'object' && Array.isArray(body.user.roles), 'GET /api/auth/me answered without { user: { roles } }');
    return body.user;
  } catch (error) {
    if (isUnauthorisedError(error)) return null;
    throw error;
  }
}

export function getCurrentUserQueryOptions() {
  return queryOptions({
    queryKey: currentUserQueryKey,
    queryFn: getCurrentUser,
    staleTime: 5 * 60_000,
  });
}

export function useCurrentUser() {
  return useQuery(getCurrentUserQueryOptions());
}
