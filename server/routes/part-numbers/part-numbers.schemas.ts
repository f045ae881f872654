export { partNumberParams, partNumberSpreadQuery, type PartNumberSpreadQuery } from '../../../shared/schemas/lenses';

export interface PartNumberParams {
  partNumber: string;
}
