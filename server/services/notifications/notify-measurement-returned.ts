import type { Queryable } from '../numbering';

export interface MeasurementReturnedNotice {
  measurementId: string;
  /** The reviewer's comment that came with the return. */
  comment: string;
  returnedById: string;
  baseUrl: string;
}

/** Queues "measurement returned" to the technician who performed it (inside the returning transaction). */
export async function notifyMeasurementReturned(_db: Queryable, _notice: MeasurementReturnedNotice): Promise<void> {
  // Filled in by the outbound-mail work (templates and recipients).
}
