import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { EquipmentItem } from '@shared/schemas/equipment';

export const equipmentQueryKey = ['equipment'] as const;

/** The whole register at once (it is tens of items, not thousands); filtering happens on the page. */
export async function getEquipment({ includeInactive }: { includeInactive: boolean }, signal?: AbortSignal): Promise<EquipmentItem[]> {
  const query = includeInactive ? '?includeInactive=true' : '';
  const body = await api.get<{ items: EquipmentItem[] }>(`/api/equipment${query}`, { signal });
  return body.items;
}

export function getEquipmentQueryOptions({ includeInactive }: { includeInactive: boolean }) {
  return queryOptions({
    queryKey: [...equipmentQueryKey, { includeInactive }],
    queryFn: ({ signal }) => getEquipment({ includeInactive }, signal),
  });
}

export function useEquipment({ includeInactive }: { includeInactive: boolean }) {
  return useQuery(getEquipmentQueryOptions({ includeInactive }));
}
