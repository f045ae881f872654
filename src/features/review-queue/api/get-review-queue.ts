import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ReviewQueueResponse } from '@shared/schemas/review';
import { api } from '@/lib/api-client';

export function getReviewQueue(signal?: AbortSignal): Promise<ReviewQueueResponse> {
  return api.get<ReviewQueueResponse>('/api/review-queue', { signal });
}

export function useReviewQueue() {
  return useQuery(queryOptions({ queryKey: ['review-queue'], queryFn: ({ signal }) => getReviewQueue(signal), refetchInterval: 60_000 }));
}
