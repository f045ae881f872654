import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { StorageSettings } from '@shared/schemas/storage';
import { storageQueryKey } from '@/features/admin-storage/api/get-storage-usage';

export async function getStorageSettings(signal?: AbortSignal): Promise<StorageSettings> {
  const body = await api.get<{ settings: StorageSettings }>('/api/storage/settings', { signal });
  return body.settings;
}

export function getStorageSettingsQueryOptions() {
  return queryOptions({ queryKey: [...storageQueryKey, 'settings'], queryFn: ({ signal }) => getStorageSettings(signal), staleTime: Infinity });
}

export function useStorageSettings() {
  return useQuery(getStorageSettingsQueryOptions());
}
