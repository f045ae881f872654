import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeasurementListItem, MeasurementListResponse, MeasurementStatus } from '@shared/schemas/measurements';
import { api } from '@/lib/api-client';

/** Everything still on the technician's plate, and what waits for a reviewer. Approved and certified work is done. */
export const OPEN_MEASUREMENT_STATUSES: MeasurementStatus[] = ['returned', 'analysis-failed', 'draft', 'analysing', 'analysed', 'submitted'];

const PAGE_SIZE = 100;

export function myOpenMeasurementsQueryKey() {
  return ['measurements', 'list', { mine: true, status: OPEN_MEASUREMENT_STATUSES }] as const;
}

export async function getMyOpenMeasurements(signal?: AbortSignal): Promise<{ items: MeasurementListItem[]; total: number }> {
  const query = new URLSearchParams({
    mine: 'true',
    status: OPEN_MEASUREMENT_STATUSES.join(','),
    sort: 'updatedAt',
    order: 'desc',
    pageSize: String(PAGE_SIZE),
  });
  const body = await api.get<MeasurementListResponse>(`/api/measurements?${query}`, { signal });
  return { items: body.items, total: body.total };
}

export function getMyOpenMeasurementsQueryOptions() {
  return queryOptions({
    queryKey: myOpenMeasurementsQueryKey(),
    queryFn: ({ signal }) => getMyOpenMeasurements(signal),
    // Analyses finish in the background; the list keeps up without a reload.
    refetchInterval: 15_000,
  });
}

export function useMyOpenMeasurements() {
  return useQuery(getMyOpenMeasurementsQueryOptions());
}
