import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReviewEntry, ReviewEntryResponse } from '@shared/schemas/review';
import { api } from '@/lib/api-client';
import { reviewEntriesKey } from './get-review-entries';

export async function addReviewComment(measurementId: string, body: string): Promise<ReviewEntry> {
  const answer = await api.post<ReviewEntryResponse>(`/api/measurements/${encodeURIComponent(measurementId)}/review-entries`, { body });
  return answer.entry;
}

export function useAddReviewComment(measurementId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: string) => addReviewComment(measurementId, body),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: reviewEntriesKey(measurementId) }),
  });
}
