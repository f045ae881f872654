import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { WorkOrderDetail } from '@shared/schemas/work-orders';
import { workOrdersQueryKey } from '@/features/work-orders/api/get-work-orders';

export function workOrderQueryKey(workOrderId: string) {
  return [...workOrdersQueryKey, 'detail', workOrderId] as const;
}

export async function getWorkOrder(workOrderId: string, signal?: AbortSignal): Promise<WorkOrderDetail> {
  const body = await api.get<{ workOrder: WorkOrderDetail }>(`/api/work-orders/${encodeURIComponent(workOrderId)}`, { signal });
  return body.workOrder;
}

export function getWorkOrderQueryOptions(workOrderId: string) {
  return queryOptions({
    queryKey: workOrderQueryKey(workOrderId),
    queryFn: ({ signal }) => getWorkOrder(workOrderId, signal),
  });
}

export function useWorkOrder(workOrderId: string, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...getWorkOrderQueryOptions(workOrderId), enabled });
}
