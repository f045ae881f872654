import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError, isUnauthorisedError } from '@/lib/api-client';

export interface CreateQueryClientOptions {
  /** Called when any query or mutation answers 401: the session has ended. */
  onUnauthorised: () => void;
}

/** A 4xx will answer the same way again; only network failures and 5xx are worth retrying. */
export function shouldRetryQuery(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export function createQueryClient({ onUnauthorised }: CreateQueryClientOptions): QueryClient {
  return new QueryClient({
    queryCache: new QueryCache({
      onError: (error) => {
        if (isUnauthorisedError(error)) onUnauthorised();
      },
    }),
    mutationCache: new MutationCache({
      onError: (error, _variables, _context, mutation) => {
        // Sign-in answers 401 for a wrong password; that is not an ended session.
        if (mutation.meta?.unauthorisedIsAnAnswer) return;
        if (isUnauthorisedError(error)) onUnauthorised();
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: shouldRetryQuery,
        refetchOnWindowFocus: true,
      },
      mutations: { retry: false },
    },
  });
}
