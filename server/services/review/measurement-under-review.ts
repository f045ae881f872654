import { and, eq } from 'drizzle-orm';
import { analysisRuns, measurements, type MeasurementStatus } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type { Queryable } from '../numbering';

export type MeasurementRow = typeof measurements.$inferSelect;

/** The measurement row locked for the rest of the transaction, so two reviewers cannot both act on one state. */
export async function lockMeasurementForReview(tx: Queryable, measurementId: string): Promise<MeasurementRow> {
  const [row] = await tx.select().from(measurements).where(eq(measurements.id, measurementId)).for('update');
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, `There is no measurement with id ${measurementId}.`);
  return row;
}

const STATE_WORDS: Record<MeasurementStatus, string> = {
  draft: 'a draft',
  analysing: 'being analysed',
  analysed: 'analysed and not yet submitted',
  'analysis-failed': 'analysed without success',
  submitted: 'submitted for review',
  approved: 'approved',
  returned: 'returned to the technician',
  certified: 'certified',
};

/** 409 naming the present state unless the measurement is in one of `allowed`. */
export function requireStatus(row: MeasurementRow, allowed: readonly MeasurementStatus[], action: string): void {
  if (allowed.includes(row.status)) return;
  throw new HttpError(
    HttpStatus.CONFLICT,
    `Measurement ${row.number} is ${STATE_WORDS[row.status]} (status ${row.status}), so it cannot ${action}; that needs status ${allowed.join(' or ')}.`,
  );
}

/** The current analysis run when it succeeded, else a 409 sentence. */
export async function requireSucceededCurrentAnalysis(tx: Queryable, row: MeasurementRow, action: string) {
  const [run] = row.currentAnalysisId
    ? await tx.select().from(analysisRuns).where(and(eq(analysisRuns.id, row.currentAnalysisId), eq(analysisRuns.status, 'succeeded')))
    : [];
  if (!run || !run.result) {
    throw new HttpError(HttpStatus.CONFLICT, `Measurement ${row.number} has no succeeded analysis, so it cannot ${action}; analyse it first.`);
  }
  return run;
}
