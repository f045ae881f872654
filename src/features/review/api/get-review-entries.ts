import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReviewEntriesResponse, ReviewEntry } from '@shared/schemas/review';
import { api } from '@/lib/api-client';

export function reviewEntriesKey(measurementId: string) {
  return ['measurements', measurementId, 'review-entries'] as const;
}

export async function getReviewEntries(measurementId: string, signal?: AbortSignal): Promise<ReviewEntry[]> {
  const body = await api.get<ReviewEntriesResponse>(`/api/measurements/${encodeURIComponent(measurementId)}/review-entries`, { signal });
  return body.entries;
}

export function useReviewEntries(measurementId: string) {
  return useQuery(queryOptions({ queryKey: reviewEntriesKey(measurementId), queryFn: ({ signal }) => getReviewEntries(measurementId, signal) }));
}
