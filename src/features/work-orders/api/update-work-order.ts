import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { UpdateWorkOrderBody, WorkOrderDetail } from '@shared/schemas/work-orders';
import { workOrdersQueryKey } from '@/features/work-orders/api/get-work-orders';

export async function updateWorkOrder(workOrderId: string, request: UpdateWorkOrderBody): Promise<WorkOrderDetail> {
  const body = await api.patch<{ workOrder: WorkOrderDetail }>(`/api/work-orders/${encodeURIComponent(workOrderId)}`, request);
  return body.workOrder;
}

export function useUpdateWorkOrder(workOrderId: string, { onUpdated }: { onUpdated?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (request: UpdateWorkOrderBody) => updateWorkOrder(workOrderId, request),
    onSuccess: async () => {
      // The list shows status and due date too, so every work-order query is refreshed.
      await queryClient.invalidateQueries({ queryKey: workOrdersQueryKey });
      onUpdated?.();
    },
  });
}
