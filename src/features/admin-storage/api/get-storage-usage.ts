import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { StorageUsage } from '@shared/schemas/storage';

export const storageQueryKey = ['admin-storage'] as const;

export interface StorageUsageRequest {
  organisationId: string | null;
  workOrderPage: number;
  measurementPage: number;
  pageSize: number;
}

export function getStorageUsage(request: StorageUsageRequest, signal?: AbortSignal): Promise<StorageUsage> {
  const query = new URLSearchParams({
    workOrderPage: String(request.workOrderPage),
    measurementPage: String(request.measurementPage),
    pageSize: String(request.pageSize),
  });
  if (request.organisationId) query.set('organisationId', request.organisationId);
  return api.get<StorageUsage>(`/api/storage/usage?${query}`, { signal });
}

export function getStorageUsageQueryOptions(request: StorageUsageRequest) {
  return queryOptions({
    queryKey: [...storageQueryKey, 'usage', request],
    queryFn: ({ signal }) => getStorageUsage(request, signal),
    placeholderData: keepPreviousData,
  });
}

export function useStorageUsage(request: StorageUsageRequest) {
  return useQuery(getStorageUsageQueryOptions(request));
}
