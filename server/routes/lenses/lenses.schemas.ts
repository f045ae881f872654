export { lensIdParams, updateLensBody, type UpdateLensInput } from '../../../shared/schemas/lenses';

export interface LensIdParams {
  lensId: string;
}
