import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateEquipmentBody, EquipmentItem, EquipmentKindName } from '@shared/schemas/equipment';
import { equipmentQueryKey } from '@/features/equipment/api/get-equipment';

/**
 * The body of `POST /api/equipment` as the form builds it: the kind's values
 * as one record (the server's per-kind schema checks them). Assignable to the
 * shared `CreateEquipmentBody` for every kind once the values are right.
 */
export type CreateEquipmentRequest = Omit<CreateEquipmentBody, 'kind' | 'values'> & {
  kind: EquipmentKindName;
  values: Record<string, string | number>;
};

export async function createEquipment(request: CreateEquipmentRequest): Promise<EquipmentItem> {
  const body = await api.post<{ equipment: EquipmentItem }>('/api/equipment', request);
  return body.equipment;
}

export function useCreateEquipment({ onCreated }: { onCreated?: (item: EquipmentItem) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createEquipment,
    onSuccess: async (item) => {
      await queryClient.invalidateQueries({ queryKey: equipmentQueryKey });
      onCreated?.(item);
    },
  });
}
