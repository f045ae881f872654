import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeasurementDetail, MeasurementResponse } from '@shared/schemas/measurements';
import { api } from '@/lib/api-client';

export function measurementQueryKey(measurementId: string) {
  return ['measurements', measurementId] as const;
}

export async function getMeasurement(measurementId: string, signal?: AbortSignal): Promise<MeasurementDetail> {
  const body = await api.get<MeasurementResponse>(`/api/measurements/${encodeURIComponent(measurementId)}`, { signal });
  return body.measurement;
}

export function getMeasurementQueryOptions(measurementId: string) {
  return queryOptions({ queryKey: measurementQueryKey(measurementId), queryFn: ({ signal }) => getMeasurement(measurementId, signal) });
}

export function useMeasurement(measurementId: string) {
  return useQuery(getMeasurementQueryOptions(measurementId));
}
