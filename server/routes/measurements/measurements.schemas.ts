export {
  createMeasurementBody,
  createSweepBody,
  listMeasurementsQuery,
  measurementIdParams,
  updateMeasurementBody,
  type CreateMeasurementInput,
  type ListMeasurementsQuery,
  type UpdateMeasurementInput,
} from '../../../shared/schemas/measurements';

export interface MeasurementIdParams {
  measurementId: string;
}
