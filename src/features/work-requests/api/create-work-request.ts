import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { WorkRequestBody, WorkRequestResponse } from '@shared/schemas/portal';

export function createWorkRequest(request: WorkRequestBody): Promise<WorkRequestResponse> {
  return api.post<WorkRequestResponse>('/api/portal/work-requests', request);
}

export function useCreateWorkRequest({ onCreated }: { onCreated?: (created: WorkRequestResponse) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createWorkRequest,
    onSuccess: async (created) => {
      // The portal's order list and the shared work-order list both gain the new order.
      await queryClient.invalidateQueries({ queryKey: ['portal'] });
      await queryClient.invalidateQueries({ queryKey: ['work-orders'] });
      onCreated?.(created);
    },
  });
}
