import type { ClientMeasurementStage } from '@shared/schemas/portal';
import type { WorkOrderStatus } from '@shared/schemas/work-orders';
import type { MeasurementMethod } from '@shared/measure/types';

export const ORDER_STATUS_WORDS: Record<WorkOrderStatus, string> = {
  requested: 'Requested — awaiting the lab',
  open: 'Accepted',
  'in-progress': 'On the bench',
  completed: 'Completed',
  cancelled: 'Cancelled',
};

export const STAGE_WORDS: Record<ClientMeasurementStage, string> = {
  'being-measured': 'Being measured',
  'in-review': 'In review',
  certified: 'Certified',
};

export const METHOD_WORDS: Record<MeasurementMethod, string> = {
  'finite-conjugate': 'Finite conjugate',
  'multi-conjugate': 'Multiple conjugates',
  displacement: 'Displacement (Bessel)',
  collimator: 'Collimator',
  'auxiliary-lens': 'Auxiliary lens',
};

/** "± 1 %" or "± 0.5 mm" (both when both are given). */
export function toleranceText(lens: { tolerancePercent: number | null; toleranceMm: number | null }): string {
  const parts: string[] = [];
  if (lens.tolerancePercent !== null) parts.push(`± ${lens.tolerancePercent} %`);
  if (lens.toleranceMm !== null) parts.push(`± ${lens.toleranceMm} mm`);
  return parts.join(', ');
}
