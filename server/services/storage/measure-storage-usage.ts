import { eq, inArray } from 'drizzle-orm';
import type {
  MeasurementStorage,
  OrganisationStorage,
  StorageBreakdown,
  StoragePage,
  StorageUsage,
  StorageUsageQuery,
  WorkOrderStorage,
} from '../../../shared/schemas/storage';
import type { Database } from '../../db/client';
import { lenses, measurements, organisations, workOrders } from '../../db/schema';
import type { ObjectStorage } from '../object-storage';
import { classifyObjectKey } from './classify-object-key';
import { addToBreakdown, byBytesDescending, emptyBreakdown } from './storage-tally';

function pageOf<T>(items: T[], page: number, pageSize: number): StoragePage<T> {
  return { items: items.slice((page - 1) * pageSize, page * pageSize), page, pageSize, total: items.length };
}

/**
 * Bytes and object counts per organisation, work order and measurement, read
 * from object storage itself (not from the database's idea of what is
 * stored). The bucket is read one listing page at a time; only the running
 * sums per record are kept, so memory grows with the number of records, not
 * of objects. Names and numbers are then joined for the rows shown.
 */
export async function measureStorageUsage(
  deps: { db: Database; storage: ObjectStorage },
  query: StorageUsageQuery,
): Promise<StorageUsage> {
  const organisationId = query.organisationId ?? null;
  const totals = emptyBreakdown();
  const outsideOrganisations = { objectCount: 0, bytes: 0 };
  const perOrganisation = new Map<string, StorageBreakdown>();
  const perWorkOrder = new Map<string, { organisationId: string; breakdown: StorageBreakdown }>();
  const perMeasurement = new Map<string, { workOrderId: string; breakdown: StorageBreakdown }>();

  for await (const page of deps.storage.listObjectPages(organisationId ? `orgs/${organisationId}/` : '')) {
    for (const object of page) {
      const place = classifyObjectKey(object.key);
      addToBreakdown(totals, place.kind, object.sizeBytes);
      if (!place.organisationId) {
        outsideOrganisations.objectCount += 1;
        outsideOrganisations.bytes += object.sizeBytes;
        continue;
      }
      let organisation = perOrganisation.get(place.organisationId);
      if (!organisation) perOrganisation.set(place.organisationId, (organisation = emptyBreakdown()));
      addToBreakdown(organisation, place.kind, object.sizeBytes);
      if (!place.workOrderId) continue;
      let workOrder = perWorkOrder.get(place.workOrderId);
      if (!workOrder) perWorkOrder.set(place.workOrderId, (workOrder = { organisationId: place.organisationId, breakdown: emptyBreakdown() }));
      addToBreakdown(workOrder.breakdown, place.kind, object.sizeBytes);
      if (!place.measurementId) continue;
      let measurement = perMeasurement.get(place.measurementId);
      if (!measurement) perMeasurement.set(place.measurementId, (measurement = { workOrderId: place.workOrderId, breakdown: emptyBreakdown() }));
      addToBreakdown(measurement.breakdown, place.kind, object.sizeBytes);
    }
  }

  const organisationIds = [...perOrganisation.keys()];
  const organisationNames = new Map(
    organisationIds.length === 0
      ? []
      : (
          await deps.db.select({ id: organisations.id, name: organisations.name }).from(organisations).where(inArray(organisations.id, organisationIds))
        ).map((row) => [row.id, row.name]),
  );

  const organisationRows: OrganisationStorage[] = [...perOrganisation]
    .map(([id, breakdown]) => ({ organisationId: id, name: organisationNames.get(id) ?? null, ...breakdown }))
    .sort(byBytesDescending((row) => row.organisationId));

  const workOrderPage = pageOf(
    [...perWorkOrder]
      .map(([id, { organisationId: owner, breakdown }]) => ({ workOrderId: id, organisationId: owner, ...breakdown }))
      .sort(byBytesDescending((row) => row.workOrderId)),
    query.workOrderPage,
    query.pageSize,
  );
  const workOrderIds = workOrderPage.items.map((row) => row.workOrderId);
  const workOrderRecords = new Map(
    workOrderIds.length === 0
      ? []
      : (
          await deps.db
            .select({ id: workOrders.id, number: workOrders.number, title: workOrders.title })
            .from(workOrders)
            .where(inArray(workOrders.id, workOrderIds))
        ).map((row) => [row.id, row]),
  );

  const measurementPage = pageOf(
    [...perMeasurement]
      .map(([id, { workOrderId, breakdown }]) => ({ measurementId: id, workOrderId, ...breakdown }))
      .sort(byBytesDescending((row) => row.measurementId)),
    query.measurementPage,
    query.pageSize,
  );
  const measurementIds = measurementPage.items.map((row) => row.measurementId);
  const measurementRecords = new Map(
    measurementIds.length === 0
      ? []
      : (
          await deps.db
            .select({ id: measurements.id, number: measurements.number, status: measurements.status, workOrderNumber: workOrders.number })
            .from(measurements)
            .innerJoin(lenses, eq(lenses.id, measurements.lensId))
            .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
            .where(inArray(measurements.id, measurementIds))
        ).map((row) => [row.id, row]),
  );

  return {
    organisationId,
    scannedAt: new Date().toISOString(),
    totals,
    outsideOrganisations,
    organisations: organisationRows,
    workOrders: {
      ...workOrderPage,
      items: workOrderPage.items.map(
        (row): WorkOrderStorage => ({
          ...row,
          number: workOrderRecords.get(row.workOrderId)?.number ?? null,
          title: workOrderRecords.get(row.workOrderId)?.title ?? null,
          organisationName: organisationNames.get(row.organisationId) ?? null,
        }),
      ),
    },
    measurements: {
      ...measurementPage,
      items: measurementPage.items.map(
        (row): MeasurementStorage => ({
          ...row,
          number: measurementRecords.get(row.measurementId)?.number ?? null,
          status: measurementRecords.get(row.measurementId)?.status ?? null,
          workOrderNumber: measurementRecords.get(row.measurementId)?.workOrderNumber ?? workOrderRecords.get(row.workOrderId)?.number ?? null,
        }),
      ),
    },
  };
}
