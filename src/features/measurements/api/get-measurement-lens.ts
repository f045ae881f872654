import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LensDetail, LensResponse } from '@shared/schemas/lenses';
import { api } from '@/lib/api-client';

/** The same key the lens pages use, so a measurement created here refreshes their history. */
export function measurementLensQueryKey(lensId: string) {
  return ['lenses', lensId] as const;
}

export async function getMeasurementLens(lensId: string, signal?: AbortSignal): Promise<LensDetail> {
  const body = await api.get<LensResponse>(`/api/lenses/${encodeURIComponent(lensId)}`, { signal });
  return body.lens;
}

export function getMeasurementLensQueryOptions(lensId: string) {
  return queryOptions({ queryKey: measurementLensQueryKey(lensId), queryFn: ({ signal }) => getMeasurementLens(lensId, signal) });
}

export function useMeasurementLens(lensId: string | null) {
  return useQuery({ ...getMeasurementLensQueryOptions(lensId ?? ''), enabled: lensId !== null });
}
