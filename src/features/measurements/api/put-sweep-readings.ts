import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ReadingsBody, SetReadingsResponse } from '@shared/schemas/readings';
import type { Frame } from '@shared/schemas/frames';
import type { MeasurementDetail } from '@shared/schemas/measurements';
import { api } from '@/lib/api-client';
import { measurementQueryKey } from '@/features/measurements/api/get-measurement';

export async function putSweepReadings({ sweepId, body }: { sweepId: string; body: ReadingsBody }): Promise<Frame[]> {
  const answer = await api.put<SetReadingsResponse>(`/api/sweeps/${encodeURIComponent(sweepId)}/readings`, body);
  return answer.frames;
}

export function usePutSweepReadings(measurementId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: putSweepReadings,
    onSuccess: (frames, { sweepId }) => {
      queryClient.setQueryData<MeasurementDetail>(measurementQueryKey(measurementId), (current) =>
        current ? { ...current, sweeps: current.sweeps.map((sweep) => (sweep.id === sweepId ? { ...sweep, frames } : sweep)) } : current,
      );
    },
  });
}
