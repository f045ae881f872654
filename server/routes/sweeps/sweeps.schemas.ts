export { sweepIdParams, updateSweepBody, type UpdateSweepBody } from '../../../shared/schemas/measurements';
export { readingsBody, type ReadingsInput } from '../../../shared/schemas/readings';

export interface SweepIdParams {
  sweepId: string;
}
