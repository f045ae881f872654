import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { measurementQueryKey } from '@/features/measurements/api/get-measurement';

export async function deleteFrame(frameId: string): Promise<void> {
  await api.delete<unknown>(`/api/frames/${encodeURIComponent(frameId)}`);
}

export function useDeleteFrame(measurementId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteFrame,
    onSettled: () => queryClient.invalidateQueries({ queryKey: measurementQueryKey(measurementId) }),
  });
}
