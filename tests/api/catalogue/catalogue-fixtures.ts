/**
 * Rows the catalogue tests need. Every name carries a random suffix because
 * all test files share one database; the measurement and analysis rows are
 * written here directly (another part of the app owns those routes).
 */
import { and, desc, eq } from 'drizzle-orm';
import type request from 'supertest';
import type { Database } from '../../../server/db/client';
import { analysisRuns, auditEvents, lenses, measurements, workOrders, type MeasurementStatus } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { uniqueSuffix } from '../../helpers/people';

export interface Session {
  agent: request.Agent;
  csrfToken: string;
}

export function sendJson(session: Session, method: 'post' | 'patch' | 'put' | 'delete', path: string, body: unknown = {}) {
  return session.agent[method](path).set(CSRF_HEADER_NAME, session.csrfToken).send(body as object);
}

export async function insertWorkOrder(
  db: Database,
  values: Partial<typeof workOrders.$inferInsert> & { organisationId: string },
): Promise<typeof workOrders.$inferSelect> {
  const [row] = await db
    .insert(workOrders)
    .values({ number: `WO-T-${uniqueSuffix()}`, title: `Fixture order ${uniqueSuffix()}`, ...values })
    .returning();
  return row;
}

export async function insertLens(
  db: Database,
  values: Partial<typeof lenses.$inferInsert> & { workOrderId: string },
): Promise<typeof lenses.$inferSelect> {
  const [row] = await db
    .insert(lenses)
    .values({ identifier: `L-${uniqueSuffix()}`, nominalFocalLengthMm: 100, tolerancePercent: 1, ...values })
    .returning();
  return row;
}

/**
 * A measurement of `lensId`; with `result`, also a succeeded analysis run
 * (version 1, or `version`) made its current analysis.
 */
export async function insertMeasurement(
  db: Database,
  options: {
    lensId: string;
    status?: MeasurementStatus;
    performedById?: string | null;
    createdAt?: Date;
    measuredOn?: string;
    result?: { focalLengthMm: number; expandedUncertaintyMm: number; coverageFactor?: number; decision?: string };
    version?: number;
    runStatus?: 'succeeded' | 'failed' | 'queued';
  },
): Promise<{ measurementId: string; number: string; analysisId: string | null }> {
  const number = `M-T-${uniqueSuffix()}`;
  const [measurement] = await db
    .insert(measurements)
    .values({
      number,
      lensId: options.lensId,
      method: 'finite-conjugate',
      status: options.status ?? (options.result ? 'analysed' : 'draft'),
      performedById: options.performedById ?? null,
      measuredOn: options.measuredOn ?? null,
      ...(options.createdAt ? { createdAt: options.createdAt } : {}),
    })
    .returning({ id: measurements.id });
  if (!options.result) return { measurementId: measurement.id, number, analysisId: null };
  const { focalLengthMm, expandedUncertaintyMm, coverageFactor = 2, decision } = options.result;
  const [run] = await db
    .insert(analysisRuns)
    .values({
      measurementId: measurement.id,
      version: options.version ?? 1,
      status: options.runStatus ?? 'succeeded',
      manifest: {},
      result: {
        method: 'finite-conjugate',
        focalLengthMm,
        standardUncertaintyMm: expandedUncertaintyMm / coverageFactor,
        expandedUncertaintyMm,
        coverageFactor,
        sweeps: [],
        uncertaintyBudget: [],
        warnings: [],
        ...(decision ? { conformity: { decision, rule: 'simple', lowerLimitMm: 0, upperLimitMm: 0, statement: '' } } : {}),
      },
    })
    .returning({ id: analysisRuns.id });
  await db.update(measurements).set({ currentAnalysisId: run.id }).where(eq(measurements.id, measurement.id));
  return { measurementId: measurement.id, number, analysisId: run.id };
}

export async function latestAuditEvent(db: Database, action: string, subjectId: string) {
  const [event] = await db
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.action, action), eq(auditEvents.subjectId, subjectId)))
    .orderBy(desc(auditEvents.id))
    .limit(1);
  return event;
}
