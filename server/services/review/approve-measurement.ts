import { eq } from 'drizzle-orm';
import { fourEyesRefusal } from '../../../shared/schemas/review';
import { measurements, reviewEntries } from '../../db/schema';
import type { Database } from '../../db/client';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import { lockMeasurementForReview, requireStatus, requireSucceededCurrentAnalysis } from './measurement-under-review';

/** submitted → approved, by a reviewer or admin who neither performed nor submitted it (four-eyes rule, 403). */
export async function approveMeasurement(db: Database, measurementId: string, actor: Actor, remark?: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await lockMeasurementForReview(tx, measurementId);
    requireStatus(row, ['submitted'], 'be approved');
    const refusal = fourEyesRefusal(row, actor.actorId, 'approve');
    if (refusal) throw new HttpError(HttpStatus.FORBIDDEN, refusal);
    const run = await requireSucceededCurrentAnalysis(tx, row, 'be approved');
    const now = new Date();
    await tx.update(measurements).set({ status: 'approved', approvedAt: now, approvedById: actor.actorId, updatedAt: now }).where(eq(measurements.id, row.id));
    await tx.insert(reviewEntries).values({
      measurementId: row.id,
      authorId: actor.actorId,
      kind: 'approval',
      body: remark ?? `Approved analysis v${run.version}.`,
      analysisRunId: run.id,
    });
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'measurement.approved',
      subjectType: 'measurement',
      subjectId: row.id,
      details: { number: row.number, analysisRunId: run.id, analysisVersion: run.version },
      ip: actor.ip ?? null,
    });
  });
}
