import { alias } from 'drizzle-orm/pg-core';
import { and, asc, eq, inArray, isNull, sql } from 'drizzle-orm';
import type { ReviewQueueItem, ReviewQueueResponse } from '../../../shared/schemas/review';
import type { Database } from '../../db/client';
import { analysisRuns, certificates, lenses, measurements, organisations, people, workOrders } from '../../db/schema';

const performer = alias(people, 'performer');
const submitter = alias(people, 'submitter');
const approver = alias(people, 'approver');

function person(id: string | null, name: string | null) {
  return id && name ? { id, name } : null;
}

/**
 * The reviewer's queue: submitted measurements, oldest submission first, and
 * approved ones whose certificate is not yet issued, oldest approval first.
 */
export async function getReviewQueue(db: Database, now: Date): Promise<ReviewQueueResponse> {
  const rows = await db
    .select({
      measurement: measurements,
      workOrderNumber: workOrders.number,
      workOrderId: workOrders.id,
      lensIdentifier: lenses.identifier,
      clientId: organisations.id,
      clientName: organisations.name,
      performerName: performer.name,
      submitterName: submitter.name,
      approverName: approver.name,
      focalLengthMm: sql<number | null>`(${analysisRuns.result}->>'focalLengthMm')::double precision`,
      expandedUncertaintyMm: sql<number | null>`(${analysisRuns.result}->>'expandedUncertaintyMm')::double precision`,
      coverageFactor: sql<number | null>`(${analysisRuns.result}->>'coverageFactor')::double precision`,
    })
    .from(measurements)
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .leftJoin(performer, eq(performer.id, measurements.performedById))
    .leftJoin(submitter, eq(submitter.id, measurements.submittedById))
    .leftJoin(approver, eq(approver.id, measurements.approvedById))
    .leftJoin(analysisRuns, and(eq(analysisRuns.id, measurements.currentAnalysisId), eq(analysisRuns.status, 'succeeded')))
    .leftJoin(certificates, eq(certificates.measurementId, measurements.id))
    .where(and(inArray(measurements.status, ['submitted', 'approved']), isNull(certificates.id)))
    .orderBy(asc(measurements.submittedAt), asc(measurements.number));

  const items = rows.map((row): ReviewQueueItem => {
    const m = row.measurement;
    const since = m.status === 'approved' ? (m.approvedAt ?? m.submittedAt) : m.submittedAt;
    return {
      measurementId: m.id,
      number: m.number,
      method: m.method,
      status: m.status,
      workOrder: { id: row.workOrderId, number: row.workOrderNumber },
      lens: { id: m.lensId, identifier: row.lensIdentifier },
      client: { id: row.clientId, name: row.clientName },
      performedBy: person(m.performedById, row.performerName),
      submittedBy: person(m.submittedById, row.submitterName),
      submittedAt: m.submittedAt?.toISOString() ?? null,
      approvedAt: m.approvedAt?.toISOString() ?? null,
      approvedBy: person(m.approvedById, row.approverName),
      focalLengthMm: row.focalLengthMm === null ? null : Number(row.focalLengthMm),
      expandedUncertaintyMm: row.expandedUncertaintyMm === null ? null : Number(row.expandedUncertaintyMm),
      coverageFactor: row.coverageFactor === null ? null : Number(row.coverageFactor),
      waitingSeconds: since ? Math.max(0, Math.round((now.getTime() - since.getTime()) / 1000)) : 0,
    };
  });
  const byApproval = (a: ReviewQueueItem, b: ReviewQueueItem) => (a.approvedAt ?? '').localeCompare(b.approvedAt ?? '') || a.number.localeCompare(b.number);
  return {
    submitted: items.filter((item) => item.status === 'submitted'),
    awaitingCertificate: items.filter((item) => item.status === 'approved').sort(byApproval),
  };
}
