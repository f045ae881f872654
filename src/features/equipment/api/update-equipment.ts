import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { EquipmentItem, UpdateEquipmentBody } from '@shared/schemas/equipment';
import { equipmentQueryKey } from '@/features/equipment/api/get-equipment';

export async function updateEquipment(equipmentId: string, request: UpdateEquipmentBody): Promise<EquipmentItem> {
  const body = await api.patch<{ equipment: EquipmentItem }>(`/api/equipment/${encodeURIComponent(equipmentId)}`, request);
  return body.equipment;
}

/** Edits, retires (`active: false`) or returns an item to service. */
export function useUpdateEquipment({ onUpdated }: { onUpdated?: (item: EquipmentItem) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ equipmentId, request }: { equipmentId: string; request: UpdateEquipmentBody }) => updateEquipment(equipmentId, request),
    onSuccess: async (item) => {
      await queryClient.invalidateQueries({ queryKey: equipmentQueryKey });
      onUpdated?.(item);
    },
  });
}
