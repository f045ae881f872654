import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { LensDetail } from '@shared/schemas/lenses';

export const lensesQueryKey = ['lenses'] as const;

export function lensQueryKey(lensId: string) {
  return [...lensesQueryKey, lensId] as const;
}

export async function getLens(lensId: string, signal?: AbortSignal): Promise<LensDetail> {
  const body = await api.get<{ lens: LensDetail }>(`/api/lenses/${encodeURIComponent(lensId)}`, { signal });
  return body.lens;
}

export function getLensQueryOptions(lensId: string) {
  return queryOptions({ queryKey: lensQueryKey(lensId), queryFn: ({ signal }) => getLens(lensId, signal) });
}

export function useLens(lensId: string, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getLensQueryOptions(lensId), enabled });
}
