import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { OrphanRemovalResult } from '@shared/schemas/storage';
import { storageQueryKey } from '@/features/admin-storage/api/get-storage-usage';

export function removeOrphanObjects(keys: string[]): Promise<OrphanRemovalResult> {
  return api.post<OrphanRemovalResult>('/api/storage/orphans/removal', { keys });
}

export function useRemoveOrphanObjects() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: removeOrphanObjects,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: storageQueryKey }),
  });
}
