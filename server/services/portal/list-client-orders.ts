import { and, asc, desc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import type {
  PortalCertificateRevision,
  PortalLens,
  PortalMeasurement,
  PortalOrdersQuery,
  PortalOrdersResponse,
  PortalResultSummary,
} from '../../../shared/schemas/portal';
import type { CertificateData } from '../../certificates/certificate-data';
import type { Database } from '../../db/client';
import { certificates, lenses, measurements, organisations, workOrders } from '../../db/schema';
import { invariant } from '../../invariant';
import { containsPattern } from '../catalogue-queries';
import { clientMeasurementStage } from './client-measurement-stage';

function resultOf(data: Record<string, unknown>): PortalResultSummary {
  const certificate = data as unknown as CertificateData;
  return {
    focalLengthMm: certificate.results.focalLengthMm,
    expandedUncertaintyMm: certificate.results.expandedUncertaintyMm,
    coverageFactor: certificate.results.coverageFactor,
    decision: certificate.conformity.decision,
  };
}

/**
 * One client organisation's work orders, newest first, with each lens, each
 * measurement's coarse stage and every certificate revision. Every query is
 * bounded by `organisationId`, including the certificates' own column, so
 * nothing of another organisation can be reached through a shared lens or id.
 */
export async function listClientOrders(db: Database, organisationId: string, query: PortalOrdersQuery): Promise<PortalOrdersResponse> {
  const [organisation] = await db.select({ id: organisations.id, name: organisations.name }).from(organisations).where(eq(organisations.id, organisationId));
  invariant(organisation, `organisation ${organisationId} does not exist`);

  const conditions: (SQL | undefined)[] = [eq(workOrders.organisationId, organisationId)];
  if (query.status && query.status.length > 0) conditions.push(inArray(workOrders.status, query.status));
  if (query.q) {
    const pattern = containsPattern(query.q);
    conditions.push(
      or(
        ilike(workOrders.number, pattern),
        ilike(workOrders.title, pattern),
        ilike(workOrders.clientReference, pattern),
        sql`exists (select 1 from lenses l where l.work_order_id = ${workOrders.id} and (l.identifier ilike ${pattern} or l.part_number ilike ${pattern}))`,
      ),
    );
  }
  const where = and(...conditions);
  const [{ total }] = await db.select({ total: sql<number>`count(*)::int` }).from(workOrders).where(where);
  const orders = await db
    .select()
    .from(workOrders)
    .where(where)
    .orderBy(desc(workOrders.createdAt), desc(workOrders.number))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);

  const orderIds = orders.map((order) => order.id);
  const lensRows = orderIds.length
    ? await db.select().from(lenses).where(inArray(lenses.workOrderId, orderIds)).orderBy(asc(lenses.identifier), asc(lenses.createdAt))
    : [];
  const lensIds = lensRows.map((lens) => lens.id);
  const measurementRows = lensIds.length
    ? await db
        .select({ id: measurements.id, lensId: measurements.lensId, number: measurements.number, method: measurements.method, status: measurements.status })
        .from(measurements)
        .where(inArray(measurements.lensId, lensIds))
        .orderBy(asc(measurements.createdAt), asc(measurements.number))
    : [];
  const measurementIds = measurementRows.map((measurement) => measurement.id);
  const certificateRows = measurementIds.length
    ? await db
        .select({
          id: certificates.id,
          measurementId: certificates.measurementId,
          number: certificates.number,
          revision: certificates.revision,
          status: certificates.status,
          issuedAt: certificates.issuedAt,
          data: certificates.data,
        })
        .from(certificates)
        .where(and(inArray(certificates.measurementId, measurementIds), eq(certificates.organisationId, organisationId)))
        .orderBy(desc(certificates.revision))
    : [];

  const certificatesByMeasurement = new Map<string, typeof certificateRows>();
  for (const row of certificateRows) {
    const list = certificatesByMeasurement.get(row.measurementId) ?? [];
    list.push(row);
    certificatesByMeasurement.set(row.measurementId, list);
  }
  const measurementsByLens = new Map<string, PortalMeasurement[]>();
  for (const row of measurementRows) {
    const revisions = certificatesByMeasurement.get(row.id) ?? [];
    const current = revisions.find((revision) => revision.status === 'current') ?? null;
    const stage = clientMeasurementStage(row.status, current !== null);
    const list = measurementsByLens.get(row.lensId) ?? [];
    list.push({
      number: row.number,
      method: row.method,
      stage,
      result: stage === 'certified' && current ? resultOf(current.data) : null,
      certificates: revisions.map(
        (revision): PortalCertificateRevision => ({
          id: revision.id,
          number: revision.number,
          revision: revision.revision,
          status: revision.status,
          issuedAt: revision.issuedAt.toISOString(),
          downloadUrl: `/api/certificates/${revision.id}/pdf`,
        }),
      ),
    });
    measurementsByLens.set(row.lensId, list);
  }
  const lensesByOrder = new Map<string, PortalLens[]>();
  for (const lens of lensRows) {
    const list = lensesByOrder.get(lens.workOrderId) ?? [];
    list.push({
      id: lens.id,
      identifier: lens.identifier,
      description: lens.description,
      partNumber: lens.partNumber,
      nominalFocalLengthMm: lens.nominalFocalLengthMm,
      tolerancePercent: lens.tolerancePercent,
      toleranceMm: lens.toleranceMm,
      measurements: measurementsByLens.get(lens.id) ?? [],
    });
    lensesByOrder.set(lens.workOrderId, list);
  }

  return {
    organisation,
    items: orders.map((order) => ({
      id: order.id,
      number: order.number,
      title: order.title,
      clientReference: order.clientReference,
      status: order.status,
      dueDate: order.dueDate,
      createdAt: order.createdAt.toISOString(),
      lenses: lensesByOrder.get(order.id) ?? [],
    })),
    total: Number(total),
    page: query.page,
    pageSize: query.pageSize,
  };
}
