import { eq } from 'drizzle-orm';
import { measurements, reviewEntries } from '../../db/schema';
import type { Database } from '../../db/client';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import { notifyMeasurementReturned } from '../notifications/notify-measurement-returned';
import { lockMeasurementForReview, requireStatus } from './measurement-under-review';

/** submitted → returned with the reviewer's comment; the technician is told by mail (queued in the same transaction). */
export async function returnMeasurement(db: Database, measurementId: string, actor: Actor, comment: string, baseUrl: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await lockMeasurementForReview(tx, measurementId);
    requireStatus(row, ['submitted'], 'be returned');
    const now = new Date();
    await tx.update(measurements).set({ status: 'returned', approvedAt: null, approvedById: null, updatedAt: now }).where(eq(measurements.id, row.id));
    await tx.insert(reviewEntries).values({
      measurementId: row.id,
      authorId: actor.actorId,
      kind: 'return',
      body: comment,
      analysisRunId: row.currentAnalysisId,
    });
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'measurement.returned',
      subjectType: 'measurement',
      subjectId: row.id,
      details: { number: row.number, comment, analysisRunId: row.currentAnalysisId },
      ip: actor.ip ?? null,
    });
    await notifyMeasurementReturned(tx, { measurementId: row.id, comment, returnedById: actor.actorId, baseUrl });
  });
}
