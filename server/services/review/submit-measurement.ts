import { eq } from 'drizzle-orm';
import { lenses, measurements, reviewEntries, workOrders } from '../../db/schema';
import type { Database } from '../../db/client';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import type { Queryable } from '../numbering';
import { analysedLensSpecificationDifference } from './analysed-lens-specification';
import { lockMeasurementForReview, requireStatus, requireSucceededCurrentAnalysis } from './measurement-under-review';

/**
 * 409 unless the run decided conformity against the lens's present nominal
 * value, tolerance and the work order's decision rule. From submission on
 * the specification is locked, so the decision the reviewer approves is the
 * one the certificate states.
 */
async function requireAnalysedAgainstCurrentLens(tx: Queryable, lensId: string, run: { version: number; manifest: unknown }): Promise<void> {
  const [current] = await tx
    .select({ lens: lenses, decisionRule: workOrders.decisionRule })
    .from(lenses)
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(eq(lenses.id, lensId))
    // updateLens locks the lens row before it checks for submitted measurements; locking it here too serialises the two.
    .for('update', { of: lenses });
  const difference = analysedLensSpecificationDifference(run.manifest, current.lens, current.decisionRule);
  if (difference === null) return;
  const sentences = {
    'no-lens-in-analysis': `Analysis v${run.version} was run without the lens's nominal focal length and tolerance, so it holds no conformity decision; run the analysis again before submitting.`,
    specification: `The lens's nominal focal length or tolerance changed after analysis v${run.version}; run the analysis again before submitting.`,
    'decision-rule': `The work order's decision rule changed to ${current.decisionRule} after analysis v${run.version}; run the analysis again before submitting.`,
  } as const;
  throw new HttpError(HttpStatus.CONFLICT, sentences[difference]);
}

/**
 * analysed | returned → submitted, by a technician. The current analysis run
 * must have succeeded against the lens's present specification, and the
 * environment must be recorded because the certificate states it.
 */
export async function submitMeasurement(db: Database, measurementId: string, actor: Actor, remark?: string): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await lockMeasurementForReview(tx, measurementId);
    requireStatus(row, ['analysed', 'returned'], 'be submitted for review');
    const run = await requireSucceededCurrentAnalysis(tx, row, 'be submitted for review');
    await requireAnalysedAgainstCurrentLens(tx, row.lensId, run);
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
