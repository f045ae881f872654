import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrphanList } from '@shared/schemas/storage';

/** Scanning the bucket is costly, so it runs when the admin asks, not on every visit. */
export function getOrphanObjects(request: { organisationId: string | null }): Promise<OrphanList> {
  const query = request.organisationId ? `?organisationId=${encodeURIComponent(request.organisationId)}` : '';
  return api.get<OrphanList>(`/api/storage/orphans${query}`);
}

export function useFindOrphanObjects() {
  return useMutation({ mutationFn: getOrphanObjects });
}
