import { queryOptions, useQuery } from '@tanstack/react-query';
import type { EquipmentItem, EquipmentKindName, EquipmentListResponse } from '@shared/schemas/equipment';
import { api } from '@/lib/api-client';

export function equipmentOfKindQueryKey(kind: EquipmentKindName) {
  return ['equipment', { kind }] as const;
}

/** Active items of one kind, for a picker. */
export async function getEquipmentOfKind(kind: EquipmentKindName, signal?: AbortSignal): Promise<EquipmentItem[]> {
  const body = await api.get<EquipmentListResponse>(`/api/equipment?kind=${encodeURIComponent(kind)}`, { signal });
  return body.items.filter((item) => item.active);
}

export function getEquipmentOfKindQueryOptions(kind: EquipmentKindName) {
  return queryOptions({ queryKey: equipmentOfKindQueryKey(kind), queryFn: ({ signal }) => getEquipmentOfKind(kind, signal) });
}

export function useEquipmentOfKind(kind: EquipmentKindName) {
  return useQuery(getEquipmentOfKindQueryOptions(kind));
}
