import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { WorkOrderListResponse } from '@shared/schemas/work-orders';
import { workOrderListApiQuery, type WorkOrderListState } from '@/features/work-orders/lib/work-order-list-state';

export const workOrdersQueryKey = ['work-orders'] as const;

export function getWorkOrders(state: WorkOrderListState, signal?: AbortSignal): Promise<WorkOrderListResponse> {
  return api.get<WorkOrderListResponse>(`/api/work-orders?${workOrderListApiQuery(state)}`, { signal });
}

export function getWorkOrdersQueryOptions(state: WorkOrderListState) {
  return queryOptions({
    queryKey: [...workOrdersQueryKey, 'list', workOrderListApiQuery(state)],
    queryFn: ({ signal }) => getWorkOrders(state, signal),
    // The old page stays on screen (dimmed) while the next one loads, so the table does not jump.
    placeholderData: keepPreviousData,
  });
}

export function useWorkOrders(state: WorkOrderListState) {
  return useQuery(getWorkOrdersQueryOptions(state));
}
