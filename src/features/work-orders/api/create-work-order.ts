import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateWorkOrderBody, WorkOrderDetail } from '@shared/schemas/work-orders';
import { workOrdersQueryKey } from '@/features/work-orders/api/get-work-orders';

export async function createWorkOrder(request: CreateWorkOrderBody): Promise<WorkOrderDetail> {
  const body = await api.post<{ workOrder: WorkOrderDetail }>('/api/work-orders', request);
  return body.workOrder;
}

export function useCreateWorkOrder({ onCreated }: { onCreated?: (workOrder: WorkOrderDetail) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createWorkOrder,
    onSuccess: async (workOrder) => {
      await queryClient.invalidateQueries({ queryKey: workOrdersQueryKey });
      onCreated?.(workOrder);
    },
  });
}
