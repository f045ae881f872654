import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Frame, FrameResponse } from '@shared/schemas/frames';
import type { MeasurementDetail } from '@shared/schemas/measurements';
import { api } from '@/lib/api-client';
import { measurementQueryKey } from '@/features/measurements/api/get-measurement';

export async function setFrameExcluded({ frameId, excluded }: { frameId: string; excluded: boolean }): Promise<Frame> {
  const answer = await api.patch<FrameResponse>(`/api/frames/${encodeURIComponent(frameId)}`, { excluded });
  return answer.frame;
}

function withFrameChanged(measurement: MeasurementDetail, frameId: string, change: (frame: Frame) => Frame): MeasurementDetail {
  return {
    ...measurement,
    sweeps: measurement.sweeps.map((sweep) => ({ ...sweep, frames: sweep.frames.map((f) => (f.id === frameId ? change(f) : f)) })),
  };
}

/** The checkbox moves at once; if the server refuses, it moves back and the error is shown. */
export function useSetFrameExcluded(measurementId: string) {
  const queryClient = useQueryClient();
  const key = measurementQueryKey(measurementId);
  return useMutation({
    mutationFn: setFrameExcluded,
    onMutate: async ({ frameId, excluded }) => {
      await queryClient.cancelQueries({ queryKey: key });
      queryClient.setQueryData<MeasurementDetail>(key, (current) => (current ? withFrameChanged(current, frameId, (f) => ({ ...f, excluded })) : current));
    },
    onError: (_error, { frameId, excluded }) => {
      // Only this frame goes back, so another toggle made meanwhile is kept.
      queryClient.setQueryData<MeasurementDetail>(key, (current) => (current ? withFrameChanged(current, frameId, (f) => ({ ...f, excluded: !excluded })) : current));
    },
    onSuccess: (frame) => {
      queryClient.setQueryData<MeasurementDetail>(key, (current) => (current ? withFrameChanged(current, frame.id, () => frame) : current));
    },
  });
}
