import type { Queryable } from '../numbering';

export interface WorkRequestedNotice {
  workOrderId: string;
  requestedById: string;
  baseUrl: string;
}

/** Queues "new work requested" to the lab (inside the transaction that created the draft work order). */
export async function notifyWorkRequested(_db: Queryable, _notice: WorkRequestedNotice): Promise<void> {
  // Filled in by the outbound-mail work (templates and recipients).
}
