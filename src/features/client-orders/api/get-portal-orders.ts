import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PortalOrdersResponse } from '@shared/schemas/portal';

export const portalOrdersQueryKey = ['portal', 'orders'] as const;

export interface PortalOrdersFilter {
  q: string;
  /** '' for every status. */
  status: string;
  page: number;
}

export function portalOrdersSearch(filter: PortalOrdersFilter): string {
  const params = new URLSearchParams();
  if (filter.q.trim()) params.set('q', filter.q.trim());
  if (filter.status) params.set('status', filter.status);
  if (filter.page > 1) params.set('page', String(filter.page));
  return params.toString();
}

export function getPortalOrders(filter: PortalOrdersFilter, signal?: AbortSignal): Promise<PortalOrdersResponse> {
  const search = portalOrdersSearch(filter);
  return api.get<PortalOrdersResponse>(`/api/portal/orders${search ? `?${search}` : ''}`, { signal });
}

export function getPortalOrdersQueryOptions(filter: PortalOrdersFilter) {
  return queryOptions({
    queryKey: [...portalOrdersQueryKey, portalOrdersSearch(filter)],
    queryFn: ({ signal }) => getPortalOrders(filter, signal),
    placeholderData: keepPreviousData,
  });
}

export function usePortalOrders(filter: PortalOrdersFilter) {
  return useQuery(getPortalOrdersQueryOptions(filter));
}
