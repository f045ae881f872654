import { and, asc, desc, eq, inArray, ne, sql } from 'drizzle-orm';
import {
  focalLengthMmFromPowerDioptres,
  lensKindOf,
  powerDioptresFromFocalLengthMm,
  type ConformityDecision,
  type CreateLensInput,
  type LatestLensMeasurement,
  type LensDetail,
  type LensMeasurementHistoryItem,
  type LensSummary,
  type UpdateLensInput,
} from '../../shared/schemas/lenses';
import type { Database } from '../db/client';
import { analysisRuns, lenses, measurements, organisations, people, workOrders, type MeasurementStatus } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import type { Queryable } from './numbering';
import { lensNotFound, recordAuditEventWithin, visibleOrganisationOf, workOrderNotFound, type Actor, type Viewer } from './catalogue-queries';

/** Read from the measurement's current analysis run, and only from a succeeded one. */
export const currentResultColumns = {
  analysisVersion: analysisRuns.version,
  focalLengthMm: sql<number | null>`(${analysisRuns.result}->>'focalLengthMm')::double precision`,
  expandedUncertaintyMm: sql<number | null>`(${analysisRuns.result}->>'expandedUncertaintyMm')::double precision`,
  coverageFactor: sql<number | null>`(${analysisRuns.result}->>'coverageFactor')::double precision`,
  decision: sql<ConformityDecision | null>`${analysisRuns.result}->'conformity'->>'decision'`,
};

export const currentSucceededAnalysis = and(eq(analysisRuns.id, measurements.currentAnalysisId), eq(analysisRuns.status, 'succeeded'));

type LensRow = typeof lenses.$inferSelect;

function toLensSummary(row: LensRow, latestMeasurement: LatestLensMeasurement | null): LensSummary {
  return {
    id: row.id,
    identifier: row.identifier,
    description: row.description,
    partNumber: row.partNumber,
    nominalFocalLengthMm: row.nominalFocalLengthMm,
    nominalPowerDioptres: powerDioptresFromFocalLengthMm(row.nominalFocalLengthMm),
    tolerancePercent: row.tolerancePercent,
    toleranceMm: row.toleranceMm,
    kind: lensKindOf(row.nominalFocalLengthMm),
    latestMeasurement,
  };
}

/** The newest measurement of each lens (by creation), with its current result when one exists. */
async function latestMeasurementsOf(db: Queryable, lensIds: string[]): Promise<Map<string, LatestLensMeasurement>> {
  if (lensIds.length === 0) return new Map();
  const rows = await db
    .selectDistinctOn([measurements.lensId], {
      lensId: measurements.lensId,
      id: measurements.id,
      number: measurements.number,
      status: measurements.status,
      method: measurements.method,
      ...currentResultColumns,
    })
    .from(measurements)
    .leftJoin(analysisRuns, currentSucceededAnalysis)
    .where(inArray(measurements.lensId, lensIds))
    .orderBy(measurements.lensId, desc(measurements.createdAt), desc(measurements.number));
  return new Map(
    rows.map((row) => [
      row.lensId,
      {
        id: row.id,
        number: row.number,
        status: row.status,
        method: row.method,
        focalLengthMm: row.focalLengthMm,
        expandedUncertaintyMm: row.expandedUncertaintyMm,
        decision: row.decision,
      },
    ]),
  );
}

async function summariesOf(db: Queryable, rows: LensRow[]): Promise<LensSummary[]> {
  const latest = await latestMeasurementsOf(
    db,
    rows.map((row) => row.id),
  );
  return rows.map((row) => toLensSummary(row, latest.get(row.id) ?? null));
}

export async function lensSummariesOfWorkOrder(db: Queryable, workOrderId: string): Promise<LensSummary[]> {
  const rows = await db.select().from(lenses).where(eq(lenses.workOrderId, workOrderId)).orderBy(asc(lenses.identifier), asc(lenses.createdAt));
  return summariesOf(db, rows);
}

/** The lens with its work order and measurement history; another organisation's lens is "not found" to a client. */
export async function getLens(db: Queryable, lensId: string, viewer: Viewer): Promise<LensDetail> {
  const [row] = await db
    .select({
      lens: lenses,
      workOrderId: workOrders.id,
      workOrderNumber: workOrders.number,
      workOrderTitle: workOrders.title,
      decisionRule: workOrders.decisionRule,
      organisationId: organisations.id,
      organisationName: organisations.name,
    })
    .from(lenses)
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .where(eq(lenses.id, lensId));
  const visibleOrganisation = visibleOrganisationOf(viewer);
  if (!row || (visibleOrganisation !== null && row.organisationId !== visibleOrganisation)) throw lensNotFound(lensId);

  const history = await db
    .select({
      id: measurements.id,
      number: measurements.number,
      method: measurements.method,
      status: measurements.status,
      measuredOn: measurements.measuredOn,
      performedById: people.id,
      performedByName: people.name,
      ...currentResultColumns,
    })
    .from(measurements)
    .leftJoin(analysisRuns, currentSucceededAnalysis)
    .leftJoin(people, eq(people.id, measurements.performedById))
    .where(eq(measurements.lensId, lensId))
    .orderBy(desc(measurements.createdAt), desc(measurements.number));

  const measurementsOfLens: LensMeasurementHistoryItem[] = history.map((m) => ({
    id: m.id,
    number: m.number,
    method: m.method,
    status: m.status,
    measuredOn: m.measuredOn,
    performedBy: m.performedById && m.performedByName ? { id: m.performedById, name: m.performedByName } : null,
    analysisVersion: m.analysisVersion ?? null,
    focalLengthMm: m.focalLengthMm,
    expandedUncertaintyMm: m.expandedUncertaintyMm,
    coverageFactor: m.coverageFactor,
    decision: m.decision,
  }));
  const latest = measurementsOfLens[0];
  return {
    ...toLensSummary(
      row.lens,
      latest
        ? {
            id: latest.id,
            number: latest.number,
            status: latest.status,
            method: latest.method,
            focalLengthMm: latest.focalLengthMm,
            expandedUncertaintyMm: latest.expandedUncertaintyMm,
            decision: latest.decision,
          }
        : null,
    ),
    workOrder: {
      id: row.workOrderId,
      number: row.workOrderNumber,
      title: row.workOrderTitle,
      decisionRule: row.decisionRule,
      organisation: { id: row.organisationId, name: row.organisationName },
    },
    measurements: measurementsOfLens,
  };
}

/** Work orders in these states take no new lenses. */
const CLOSED_WORK_ORDER_STATUSES = new Set(['completed', 'cancelled']);
/** Once a measurement is under review or done, the specification it was judged against is fixed. */
const SPECIFICATION_LOCKING_STATUSES: MeasurementStatus[] = ['submitted', 'approved', 'certified'];

function duplicateLensIdentifier(identifier: string, workOrderNumber: string): HttpError {
  const message = `A lens with the identifier "${identifier}" is already on work order ${workOrderNumber}.`;
  return new HttpError(HttpStatus.CONFLICT, message, { identifier: message });
}

async function identifierTaken(tx: Queryable, workOrderId: string, identifier: string, exceptLensId?: string): Promise<boolean> {
  const [clash] = await tx
    .select({ id: lenses.id })
    .from(lenses)
    .where(
      and(
        eq(lenses.workOrderId, workOrderId),
        sql`lower(${lenses.identifier}) = lower(${identifier})`,
        exceptLensId ? ne(lenses.id, exceptLensId) : undefined,
      ),
    )
    .limit(1);
  return Boolean(clash);
}

export async function createLens(db: Database, workOrderId: string, input: CreateLensInput, actor: Actor): Promise<LensSummary> {
  return db.transaction(async (tx) => {
    // Locking the order makes the duplicate-identifier check and the insert one step.
    const [workOrder] = await tx
      .select({ id: workOrders.id, number: workOrders.number, status: workOrders.status })
      .from(workOrders)
      .where(eq(workOrders.id, workOrderId))
      .for('update');
    if (!workOrder) throw workOrderNotFound(workOrderId);
    if (CLOSED_WORK_ORDER_STATUSES.has(workOrder.status)) {
      throw new HttpError(
        HttpStatus.CONFLICT,
        `Work order ${workOrder.number} is ${workOrder.status}; reopen it before adding lenses.`,
      );
    }
    if (await identifierTaken(tx, workOrderId, input.identifier)) throw duplicateLensIdentifier(input.identifier, workOrder.number);

    const nominalFocalLengthMm =
      input.nominalFocalLengthMm ?? focalLengthMmFromPowerDioptres(input.nominalPowerDioptres as number);
    const [row] = await tx
      .insert(lenses)
      .values({
        workOrderId,
        identifier: input.identifier,
        description: input.description ?? '',
        partNumber: input.partNumber ?? null,
        nominalFocalLengthMm,
        tolerancePercent: input.tolerancePercent ?? null,
        toleranceMm: input.toleranceMm ?? null,
      })
      .returning();
    await tx.update(workOrders).set({ updatedAt: new Date() }).where(eq(workOrders.id, workOrderId));
    await recordAuditEventWithin(tx, {
      actorId: actor.actorId,
      action: 'lens.created',
      subjectType: 'lens',
      subjectId: row.id,
      details: {
        workOrderId,
        workOrderNumber: workOrder.number,
        identifier: row.identifier,
        partNumber: row.partNumber,
        nominalFocalLengthMm,
        givenAs: input.nominalPowerDioptres !== undefined ? 'power' : 'focal-length',
        tolerancePercent: row.tolerancePercent,
        toleranceMm: row.toleranceMm,
      },
      ip: actor.ip,
    });
    return toLensSummary(row, null);
  });
}

export async function updateLens(db: Database, lensId: string, input: UpdateLensInput, actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    const [existing] = await tx.select().from(lenses).where(eq(lenses.id, lensId)).for('update');
    if (!existing) throw lensNotFound(lensId);

    const changes: Partial<typeof lenses.$inferInsert> = {};
    if (input.identifier !== undefined) changes.identifier = input.identifier;
    if (input.description !== undefined) changes.description = input.description;
    if (input.partNumber !== undefined) changes.partNumber = input.partNumber;
    if (input.nominalFocalLengthMm !== undefined) changes.nominalFocalLengthMm = input.nominalFocalLengthMm;
    if (input.nominalPowerDioptres !== undefined) changes.nominalFocalLengthMm = focalLengthMmFromPowerDioptres(input.nominalPowerDioptres);
    if (input.tolerancePercent !== undefined) changes.tolerancePercent = input.tolerancePercent;
    if (input.toleranceMm !== undefined) changes.toleranceMm = input.toleranceMm;
    const changedFields = Object.keys(changes).filter(
      (key) => changes[key as keyof typeof changes] !== existing[key as keyof LensRow],
    );

    const tolerancePercent = changes.tolerancePercent !== undefined ? changes.tolerancePercent : existing.tolerancePercent;
    const toleranceMm = changes.toleranceMm !== undefined ? changes.toleranceMm : existing.toleranceMm;
    if (tolerancePercent === null && toleranceMm === null) {
      const message = 'The lens would be left without a tolerance: keep "tolerancePercent" or "toleranceMm".';
      throw new HttpError(HttpStatus.BAD_REQUEST, message, { tolerancePercent: message, toleranceMm: message });
    }

    const specificationFields = ['nominalFocalLengthMm', 'tolerancePercent', 'toleranceMm'];
    if (changedFields.some((field) => specificationFields.includes(field))) {
      const [locking] = await tx
        .select({ number: measurements.number, status: measurements.status })
        .from(measurements)
        .where(and(eq(measurements.lensId, lensId), inArray(measurements.status, SPECIFICATION_LOCKING_STATUSES)))
        .limit(1);
      if (locking) {
        throw new HttpError(
          HttpStatus.CONFLICT,
          `Measurement ${locking.number} of this lens is ${locking.status}; its nominal value and tolerance can no longer change.`,
        );
      }
    }

    if (changes.identifier !== undefined && changedFields.includes('identifier')) {
      if (await identifierTaken(tx, existing.workOrderId, changes.identifier, lensId)) {
        const [workOrder] = await tx.select({ number: workOrders.number }).from(workOrders).where(eq(workOrders.id, existing.workOrderId));
        throw duplicateLensIdentifier(changes.identifier, workOrder.number);
      }
    }

    if (Object.keys(changes).length > 0) {
      const [row] = await tx.update(lenses).set(changes).where(eq(lenses.id, lensId)).returning({ id: lenses.id });
      invariant(row, `lens ${lensId} vanished during its update`);
    }
    await recordAuditEventWithin(tx, {
      actorId: actor.actorId,
      action: 'lens.updated',
      subjectType: 'lens',
      subjectId: lensId,
      details: {
        identifier: changes.identifier ?? existing.identifier,
        changedFields,
        before: Object.fromEntries(changedFields.map((key) => [key, existing[key as keyof LensRow]])),
        after: Object.fromEntries(changedFields.map((key) => [key, changes[key as keyof typeof changes]])),
      },
      ip: actor.ip,
    });
  });
}
