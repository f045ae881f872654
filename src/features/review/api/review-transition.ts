import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { MeasurementDetail, MeasurementResponse } from '@shared/schemas/measurements';
import { api } from '@/lib/api-client';
import { measurementKey } from './measurement-query-key';
import { reviewEntriesKey } from './get-review-entries';

export type ReviewTransition = 'submission' | 'approval' | 'return';

export async function postReviewTransition(measurementId: string, transition: ReviewTransition, body: object): Promise<MeasurementDetail> {
  const answer = await api.post<MeasurementResponse>(`/api/measurements/${encodeURIComponent(measurementId)}/${transition}`, body);
  return answer.measurement;
}

/** Submit, approve or return; the measurement and its thread are fetched again afterwards. */
export function useReviewTransition(measurementId: string, transition: ReviewTransition) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: object) => postReviewTransition(measurementId, transition, body),
    onSuccess: (measurement) => {
      queryClient.setQueryData(measurementKey(measurementId), measurement);
      void queryClient.invalidateQueries({ queryKey: reviewEntriesKey(measurementId) });
      void queryClient.invalidateQueries({ queryKey: ['review-queue'] });
    },
  });
}
