import { eq } from 'drizzle-orm';
import { measurements, reviewEntries } from '../../db/schema';
import type { Database } from '../../db/client';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import { lockMeasurementForReview, requireStatus, requireSucceededCurrentAnalysis } from './measurement-under-review';

/**
 * analysed | returned → submitted, by a technician. The current analysis run
 * must have succeeded, and the environment must be recorded because the
 * certificate states it.
 */
export async function submitMeasurement(db: Database, measurementId: string, actor: Actor, remark?: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await lockMeasurementForReview(tx, measurementId);
    requireStatus(row, ['analysed', 'returned'], 'be submitted for review');
    const run = await requireSucceededCurrentAnalysis(tx, row, 'be submitted for review');
    if (row.temperatureC === null || row.relativeHumidityPercent === null) {
      throw new HttpError(
        HttpStatus.CONFLICT,
        `Record the temperature and relative humidity of measurement ${row.number} before submitting it; the certificate states the conditions of measurement.`,
      );
    }
    const now = new Date();
    await tx
      .update(measurements)
      .set({ status: 'submitted', submittedAt: now, submittedById: actor.actorId, approvedAt: null, approvedById: null, updatedAt: now })
      .where(eq(measurements.id, row.id));
    await tx.insert(reviewEntries).values({
      measurementId: row.id,
      authorId: actor.actorId,
      kind: 'submission',
      body: remark ?? `Submitted analysis v${run.version} for review.`,
      analysisRunId: run.id,
    });
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'measurement.submitted',
      subjectType: 'measurement',
      subjectId: row.id,
      details: { number: row.number, from: row.status, analysisRunId: run.id, analysisVersion: run.version },
      ip: actor.ip ?? null,
    });
  });
}
