import { useState, type ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { createQueryClient } from '@/lib/query-client';
import { currentUserQueryKey } from '@/features/auth/api/get-current-user';

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(() => {
    const client = createQueryClient({
      // Any 401 means the session ended: forget the person; the route guard sends them to sign-in.
      onUnauthorised: () => client.setQueryData(currentUserQueryKey, null),
    });
    return client;
  });
  return (
    <QueryClientProvider client={queryClient}>
      <RegionErrorBoundary region="Paraxia">{children}</RegionErrorBoundary>
    </QueryClientProvider>
  );
}
