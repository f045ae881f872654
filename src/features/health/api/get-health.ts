import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, isApiError } from '@/lib/api-client';
import type { HealthReport } from '@/types/api';

export const healthQueryKey = ['health'] as const;
const HEALTH_REFRESH_MS = 15_000;

function isHealthReport(body: unknown): body is HealthReport {
  return typeof body === 'object' && body !== null && 'status' in body && 'checks' in body;
}

/** A degraded server may answer 503 with the same report; that is still a report to show. */
export async function getHealth(): Promise<HealthReport> {
  try {
    return await api.get<HealthReport>('/api/health');
  } catch (error) {
    if (isApiError(error) && error.status === 503 && isHealthReport(error.body)) return error.body;
    throw error;
  }
}

export function getHealthQueryOptions() {
  return queryOptions({
    queryKey: healthQueryKey,
    queryFn: getHealth,
    staleTime: 0,
    refetchInterval: HEALTH_REFRESH_MS,
  });
}

export function useHealth() {
  return useQuery(getHealthQueryOptions());
}
