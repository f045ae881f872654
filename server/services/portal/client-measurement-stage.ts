import type { MeasurementStatus } from '../../db/schema';
import type { ClientMeasurementStage } from '../../../shared/schemas/portal';

/** A measurement's status as its client may know it; "certified" needs a current certificate as well. */
export function clientMeasurementStage(status: MeasurementStatus, hasCurrentCertificate: boolean): ClientMeasurementStage {
  if (status === 'certified' && hasCurrentCertificate) return 'certified';
  if (status === 'submitted' || status === 'approved' || status === 'certified') return 'in-review';
  return 'being-measured';
}
