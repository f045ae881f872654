export {
  createWorkOrderBody,
  listWorkOrdersQuery,
  updateWorkOrderBody,
  workOrderIdParams,
  type CreateWorkOrderInput,
  type ListWorkOrdersQuery,
  type UpdateWorkOrderInput,
} from '../../../shared/schemas/work-orders';
export { createLensBody, type CreateLensInput } from '../../../shared/schemas/lenses';

export interface WorkOrderIdParams {
  workOrderId: string;
}
