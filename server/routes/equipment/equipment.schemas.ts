export {
  createEquipmentBody,
  equipmentIdParams,
  listEquipmentQuery,
  updateEquipmentBody,
  type CreateEquipmentInput,
  type ListEquipmentQuery,
  type UpdateEquipmentInput,
} from '../../../shared/schemas/equipment';

export interface EquipmentIdParams {
  equipmentId: string;
}
