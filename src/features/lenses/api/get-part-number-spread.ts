import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PartNumberSpreadResponse } from '@shared/schemas/lenses';

export function partNumberSpreadQueryKey(partNumber: string) {
  return ['part-numbers', partNumber, 'spread'] as const;
}

export function getPartNumberSpread(partNumber: string, signal?: AbortSignal): Promise<PartNumberSpreadResponse> {
  return api.get<PartNumberSpreadResponse>(`/api/part-numbers/${encodeURIComponent(partNumber)}/spread`, { signal });
}

export function getPartNumberSpreadQueryOptions(partNumber: string) {
  return queryOptions({
    queryKey: partNumberSpreadQueryKey(partNumber),
    queryFn: ({ signal }) => getPartNumberSpread(partNumber, signal),
  });
}

/** Lab staff only (the server refuses clients); pass `enabled: false` otherwise. */
export function usePartNumberSpread(partNumber: string | null, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getPartNumberSpreadQueryOptions(partNumber ?? ''), enabled: enabled && partNumber !== null && partNumber !== '' });
}
