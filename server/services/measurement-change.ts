import { eq } from 'drizzle-orm';
import { measurements } from '../db/schema';
import { recordAuditEvent } from './audit-log';
import type { Actor } from './catalogue-queries';
import type { Queryable } from './numbering';

/**
 * A change to a measurement's set-up, frames or readings, inside the
 * transaction that made it: the measurement's `updatedAt` moves and the audit
 * log records who did what, both committing or rolling back with the change.
 */
export async function recordMeasurementChange(
  tx: Queryable,
  change: { measurementId: string; actor: Actor; action: string; details: Record<string, unknown> },
): Promise<void> {
  await tx.update(measurements).set({ updatedAt: new Date() }).where(eq(measurements.id, change.measurementId));
  await recordAuditEvent(tx, {
    actorId: change.actor.actorId,
    action: change.action,
    subjectType: 'measurement',
    subjectId: change.measurementId,
    details: change.details,
    ip: change.actor.ip ?? null,
  });
}
