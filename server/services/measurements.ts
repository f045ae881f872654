/**
 * Measurements and their sweeps: set-up (lens, method, equipment with its
 * calibration state, overrides), the technician's list, the full detail the
 * measurement page reads, and the changes allowed before submission.
 */
import { and, asc, desc, eq, ilike, inArray, or, sql, type SQL } from 'drizzle-orm';
import type { EquipmentItem } from '../../shared/schemas/equipment';
import { compareFrameFileNames } from '../../shared/schemas/frames';
import { lensKindOf } from '../../shared/schemas/lenses';
import {
  canEditSetup,
  equipmentFields,
  equipmentKindNames,
  measurementSetupProblems,
  type CreateMeasurementInput,
  type EquipmentOverrideRecord,
  type EquipmentRole,
  type ListMeasurementsQuery,
  type MeasurementDetail,
  type MeasurementListItem,
  type MeasurementListResponse,
  type MeasurementSortField,
  type SetupProblem,
  type SweepDetail,
  type SweepSetup,
  type UpdateMeasurementInput,
} from '../../shared/schemas/measurements';
import type { Database } from '../db/client';
import { analysisRuns, auditEvents, equipment, frames, lenses, measurements, organisations, people, sweeps, workOrders } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import { findAnalysisRunById, listAnalysisRunSummaries } from './analysis-runs';
import { containsPattern, type Actor } from './catalogue-queries';
import { recordMeasurementChange } from './measurement-change';
import { calibrationStateOf, toEquipmentItem } from './equipment';
import { deleteFrameObjects, frameChangeRefusal, sweepObjectPrefix, toFrame, type StoreFrameDeps } from './frame-storage';
import { allocateNumber, type Queryable } from './numbering';
import { listMeasurementCertificates } from './certificates/certificate-records';

type MeasurementRow = typeof measurements.$inferSelect;
type EquipmentRow = typeof equipment.$inferSelect;
type SweepRow = typeof sweeps.$inferSelect;

export function measurementNotFound(measurementId: string): HttpError {
  return new HttpError(HttpStatus.NOT_FOUND, `There is no measurement with id ${measurementId}.`);
}

/** One 400 from per-field sentences: the sentence itself when there is one, else the list of fields. */
export function fieldProblems(fields: Record<string, string>): HttpError {
  const entries = Object.entries(fields);
  invariant(entries.length > 0, 'fieldProblems needs at least one problem');
  const message = entries.length === 1 ? entries[0][1] : `Some fields need attention: ${entries.map(([field]) => field).join(', ')}.`;
  return new HttpError(HttpStatus.BAD_REQUEST, message, fields);
}

function problemsToFields(problems: SetupProblem[]): Record<string, string> {
  return Object.fromEntries(problems.map((problem) => [problem.path.join('.'), problem.message]));
}

/* --------------------------------- create --------------------------------- */

const EQUIPMENT_ID_OF_ROLE: Record<EquipmentRole, keyof Pick<MeasurementRow, 'cameraId' | 'targetId' | 'railScaleId' | 'collimatorId' | 'auxiliaryLensId'>> = {
  camera: 'cameraId',
  target: 'targetId',
  'rail-scale': 'railScaleId',
  collimator: 'collimatorId',
  'auxiliary-lens': 'auxiliaryLensId',
};

/**
 * Checks the equipment a set-up names: each id exists, is of its field's
 * kind and is active; an item past its calibration due date needs an
 * override with a reason, and an override must concern such an item.
 */
function equipmentProblems(
  input: Pick<CreateMeasurementInput, 'cameraId' | 'targetId' | 'railScaleId' | 'collimatorId' | 'auxiliaryLensId' | 'overrides'>,
  rows: Map<string, EquipmentRow>,
  today: string,
): Record<string, string> {
  const fields: Record<string, string> = {};
  const used = new Map<string, EquipmentRow>();
  for (const { field, kind } of equipmentFields) {
    const id = input[field];
    if (!id) continue;
    const row = rows.get(id);
    const wanted = equipmentKindNames[kind];
    if (!row) {
      fields[field] = `${field}: there is no equipment with id ${id} in the register.`;
      continue;
    }
    if (row.kind !== kind) {
      fields[field] = `${field}: ${row.identifier} is a ${equipmentKindNames[row.kind]}, not a ${wanted}.`;
      continue;
    }
    if (!row.active) {
      fields[field] = `${field}: ${wanted} ${row.identifier} has been retired from the register; choose another.`;
      continue;
    }
    used.set(id, row);
    if (calibrationStateOf(row.calibrationDueDate, today) === 'overdue' && !input.overrides.some((o) => o.equipmentId === id)) {
      fields[field] = `${field}: ${wanted} ${row.identifier} is past its calibration due date (${row.calibrationDueDate}); give a reason to use it anyway.`;
    }
  }
  const overridden = new Set<string>();
  input.overrides.forEach((override, index) => {
    const field = `overrides.${index}.equipmentId`;
    const row = used.get(override.equipmentId) ?? rows.get(override.equipmentId);
    const name = row ? `${equipmentKindNames[row.kind]} ${row.identifier}` : `equipment ${override.equipmentId}`;
    if (overridden.has(override.equipmentId)) fields[field] = `${field}: ${name} has more than one override; give one reason.`;
    else if (!used.has(override.equipmentId)) fields[field] ??= `${field}: ${name} is not used by this measurement; remove the override.`;
    else if (calibrationStateOf(row!.calibrationDueDate, today) !== 'overdue') {
      fields[field] = `${field}: ${name} is within its calibration date (due ${row!.calibrationDueDate}); no override is needed.`;
    }
    overridden.add(override.equipmentId);
  });
  return fields;
}

async function equipmentByIds(db: Queryable, ids: (string | null | undefined)[]): Promise<Map<string, EquipmentRow>> {
  const wanted = [...new Set(ids.filter((id): id is string => Boolean(id)))];
  if (wanted.length === 0) return new Map();
  const rows = await db.select().from(equipment).where(inArray(equipment.id, wanted));
  return new Map(rows.map((row) => [row.id, row]));
}

/**
 * Creates a measurement and its sweeps in one transaction, numbered
 * M-YYYY-NNNN, performed by `actor`. Refuses (400 naming the field) an
 * unknown lens, equipment of the wrong kind, retired or past its
 * calibration due date without an override reason, and a set-up its method
 * cannot use. Returns the new measurement's id.
 */
export async function createMeasurement(db: Database, input: CreateMeasurementInput, actor: Actor, today: string): Promise<string> {
  const [lens] = await db
    .select({ id: lenses.id, identifier: lenses.identifier, nominalFocalLengthMm: lenses.nominalFocalLengthMm, workOrderStatus: workOrders.status, workOrderNumber: workOrders.number })
    .from(lenses)
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(eq(lenses.id, input.lensId));
  if (!lens) throw fieldProblems({ lensId: `lensId: there is no lens with id ${input.lensId}.` });
  if (lens.workOrderStatus === 'cancelled') {
    throw new HttpError(HttpStatus.CONFLICT, `Work order ${lens.workOrderNumber} is cancelled; no new measurements can be made for lens ${lens.identifier}.`);
  }

  const rows = await equipmentByIds(db, [input.cameraId, input.targetId, input.railScaleId, input.collimatorId, input.auxiliaryLensId]);
  const fields = {
    ...problemsToFields(measurementSetupProblems(input, lens)),
    ...equipmentProblems(input, rows, today),
  };
  if (Object.keys(fields).length > 0) throw fieldProblems(fields);

  const recordedAt = new Date().toISOString();
  const overrides = input.overrides.map((o) => ({ equipmentId: o.equipmentId, reason: o.reason, recordedById: actor.actorId, recordedAt }));
  const year = Number(today.slice(0, 4));

  return db.transaction(async (tx) => {
    const number = await allocateNumber(tx, 'measurement', year);
    const [created] = await tx
      .insert(measurements)
      .values({
        number,
        lensId: input.lensId,
        method: input.method,
        cameraId: input.cameraId,
        targetId: input.targetId,
        railScaleId: input.railScaleId,
        collimatorId: input.collimatorId ?? null,
        auxiliaryLensId: input.auxiliaryLensId ?? null,
        equipmentOverrides: overrides,
        temperatureC: input.temperatureC ?? null,
        relativeHumidityPercent: input.relativeHumidityPercent ?? null,
        measuredOn: input.measuredOn ?? null,
        focusOperator: input.focusOperator ?? 'gradient-energy',
        notes: input.notes ?? null,
        performedById: actor.actorId,
      })
      .returning({ id: measurements.id });
    await tx.insert(sweeps).values(
      input.sweeps.map((sweep, position) => ({
        measurementId: created.id,
        position,
        moving: sweep.moving,
        objectPositionMm: sweep.objectPositionMm ?? null,
        lensPositionMm: sweep.lensPositionMm ?? null,
        sensorPositionMm: sweep.sensorPositionMm ?? null,
      })),
    );
    await tx.insert(auditEvents).values({
      actorId: actor.actorId,
      action: 'measurement.created',
      subjectType: 'measurement',
      subjectId: created.id,
      details: { number, lensId: input.lensId, method: input.method, sweeps: input.sweeps.length },
      ip: actor.ip ?? null,
    });
    for (const override of overrides) {
      const row = rows.get(override.equipmentId);
      await tx.insert(auditEvents).values({
        actorId: actor.actorId,
        action: 'measurement.calibration-override',
        subjectType: 'measurement',
        subjectId: created.id,
        details: { number, equipmentId: override.equipmentId, identifier: row?.identifier, calibrationDueDate: row?.calibrationDueDate, reason: override.reason },
        ip: actor.ip ?? null,
      });
    }
    return created.id;
  });
}

/* ---------------------------------- list ---------------------------------- */

const SORT_COLUMNS: Record<MeasurementSortField, SQL> = {
  number: sql`${measurements.number}`,
  updatedAt: sql`${measurements.updatedAt}`,
  createdAt: sql`${measurements.createdAt}`,
  // The enum sorts in its declared order, which is the order of the work.
  status: sql`${measurements.status}`,
};

export async function listMeasurements(db: Database, query: ListMeasurementsQuery, viewer: { id: string }): Promise<MeasurementListResponse> {
  const conditions: (SQL | undefined)[] = [];
  if (query.status && query.status.length > 0) conditions.push(inArray(measurements.status, query.status));
  if (query.mine) conditions.push(eq(measurements.performedById, viewer.id));
  if (query.lensId) conditions.push(eq(measurements.lensId, query.lensId));
  if (query.q) {
    const pattern = containsPattern(query.q);
    conditions.push(or(ilike(measurements.number, pattern), ilike(lenses.identifier, pattern), ilike(workOrders.number, pattern)));
  }
  const where = and(...conditions);
  const sort = query.sort ?? 'updatedAt';
  const order = query.order ?? (sort === 'updatedAt' || sort === 'createdAt' ? 'desc' : 'asc');
  const direction = order === 'asc' ? asc : desc;

  const [{ total }] = await db
    .select({ total: sql<number>`count(*)::int` })
    .from(measurements)
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(where);
  const rows = await db
    .select({
      id: measurements.id,
      number: measurements.number,
      method: measurements.method,
      status: measurements.status,
      updatedAt: measurements.updatedAt,
      lensId: lenses.id,
      lensIdentifier: lenses.identifier,
      workOrderId: workOrders.id,
      workOrderNumber: workOrders.number,
      performedById: people.id,
      performedByName: people.name,
      focalLengthMm: sql<number | null>`(${analysisRuns.result}->>'focalLengthMm')::double precision`,
      expandedUncertaintyMm: sql<number | null>`(${analysisRuns.result}->>'expandedUncertaintyMm')::double precision`,
    })
    .from(measurements)
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .leftJoin(people, eq(people.id, measurements.performedById))
    .leftJoin(analysisRuns, and(eq(analysisRuns.id, measurements.currentAnalysisId), eq(analysisRuns.status, 'succeeded')))
    .where(where)
    .orderBy(direction(SORT_COLUMNS[sort]), direction(measurements.number), asc(measurements.id))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);

  const items: MeasurementListItem[] = rows.map((row) => ({
    id: row.id,
    number: row.number,
    method: row.method,
    status: row.status,
    lens: { id: row.lensId, identifier: row.lensIdentifier },
    workOrder: { id: row.workOrderId, number: row.workOrderNumber },
    performedBy: row.performedById && row.performedByName ? { id: row.performedById, name: row.performedByName } : null,
    updatedAt: row.updatedAt.toISOString(),
    focalLengthMm: row.focalLengthMm === null ? null : Number(row.focalLengthMm),
    expandedUncertaintyMm: row.expandedUncertaintyMm === null ? null : Number(row.expandedUncertaintyMm),
  }));
  return { items, total: Number(total), page: query.page, pageSize: query.pageSize };
}

/* --------------------------------- detail --------------------------------- */

async function framesBySweep(db: Queryable, sweepIds: string[]) {
  const byId = new Map<string, (typeof frames.$inferSelect)[]>();
  if (sweepIds.length === 0) return byId;
  const rows = await db.select().from(frames).where(inArray(frames.sweepId, sweepIds));
  for (const row of rows) {
    const list = byId.get(row.sweepId) ?? [];
    list.push(row);
    byId.set(row.sweepId, list);
  }
  for (const list of byId.values()) list.sort((a, b) => compareFrameFileNames(a.fileName, b.fileName));
  return byId;
}

export function toSweepDetail(row: SweepRow, frameRows: (typeof frames.$inferSelect)[]): SweepDetail {
  return {
    id: row.id,
    position: row.position,
    moving: row.moving,
    objectPositionMm: row.objectPositionMm,
    lensPositionMm: row.lensPositionMm,
    sensorPositionMm: row.sensorPositionMm,
    frames: frameRows.map(toFrame),
  };
}

/** Everything the measurement page shows: lens, work order, equipment with calibration state, overrides, sweeps with frames, analyses. */
export async function getMeasurementDetail(db: Database, measurementId: string, today: string): Promise<MeasurementDetail> {
  const [row] = await db
    .select({
      measurement: measurements,
      lens: lenses,
      workOrderId: workOrders.id,
      workOrderNumber: workOrders.number,
      workOrderTitle: workOrders.title,
      decisionRule: workOrders.decisionRule,
      organisationId: organisations.id,
      organisationName: organisations.name,
      performedByName: people.name,
    })
    .from(measurements)
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .leftJoin(people, eq(people.id, measurements.performedById))
    .where(eq(measurements.id, measurementId));
  if (!row) throw measurementNotFound(measurementId);
  const m = row.measurement;

  const equipmentRows = await equipmentByIds(db, [m.cameraId, m.targetId, m.railScaleId, m.collimatorId, m.auxiliaryLensId]);
  const roleOf = new Map<string, EquipmentRole>();
  const equipmentList: (EquipmentItem & { role: EquipmentRole })[] = [];
  for (const { role } of equipmentFields) {
    const id = m[EQUIPMENT_ID_OF_ROLE[role]];
    const item = id ? equipmentRows.get(id) : undefined;
    if (!item) continue;
    roleOf.set(item.id, role);
    equipmentList.push({ role, ...toEquipmentItem(item, today) });
  }

  const recorderIds = [...new Set(m.equipmentOverrides.map((o) => o.recordedById).filter(Boolean))];
  const recorders = recorderIds.length
    ? new Map((await db.select({ id: people.id, name: people.name }).from(people).where(inArray(people.id, recorderIds))).map((p) => [p.id, p.name]))
    : new Map<string, string>();
  const overrides: EquipmentOverrideRecord[] = m.equipmentOverrides.map((o) => ({
    equipmentId: o.equipmentId,
    identifier: equipmentRows.get(o.equipmentId)?.identifier ?? null,
    role: roleOf.get(o.equipmentId) ?? null,
    reason: o.reason,
    recordedBy: recorders.has(o.recordedById) ? { id: o.recordedById, name: recorders.get(o.recordedById)! } : null,
    recordedAt: o.recordedAt,
  }));

  const sweepRows = await db.select().from(sweeps).where(eq(sweeps.measurementId, m.id)).orderBy(asc(sweeps.position));
  const frameRows = await framesBySweep(
    db,
    sweepRows.map((s) => s.id),
  );

  const analyses = await listAnalysisRunSummaries(db, m.id);
  const reviewerIds = [m.submittedById, m.approvedById].filter((id): id is string => Boolean(id));
  const reviewers = reviewerIds.length
    ? new Map((await db.select({ id: people.id, name: people.name }).from(people).where(inArray(people.id, reviewerIds))).map((p) => [p.id, p.name]))
    : new Map<string, string>();
  const personOf = (id: string | null) => (id && reviewers.has(id) ? { id, name: reviewers.get(id)! } : null);
  const currentAnalysis = m.currentAnalysisId ? await findAnalysisRunById(db, m.currentAnalysisId) : null;

  return {
    id: m.id,
    number: m.number,
    method: m.method,
    status: m.status,
    lens: {
      id: row.lens.id,
      identifier: row.lens.identifier,
      description: row.lens.description,
      partNumber: row.lens.partNumber,
      nominalFocalLengthMm: row.lens.nominalFocalLengthMm,
      tolerancePercent: row.lens.tolerancePercent,
      toleranceMm: row.lens.toleranceMm,
      kind: lensKindOf(row.lens.nominalFocalLengthMm),
    },
    workOrder: {
      id: row.workOrderId,
      number: row.workOrderNumber,
      title: row.workOrderTitle,
      decisionRule: row.decisionRule,
      organisation: { id: row.organisationId, name: row.organisationName },
    },
    equipment: equipmentList,
    overrides,
    temperatureC: m.temperatureC,
    relativeHumidityPercent: m.relativeHumidityPercent,
    measuredOn: m.measuredOn,
    focusOperator: m.focusOperator,
    notes: m.notes,
    performedBy: m.performedById && row.performedByName ? { id: m.performedById, name: row.performedByName } : null,
    createdAt: m.createdAt.toISOString(),
    updatedAt: m.updatedAt.toISOString(),
    sweeps: sweepRows.map((s) => toSweepDetail(s, frameRows.get(s.id) ?? [])),
    currentAnalysis,
    analyses,
    review: {
      submittedAt: m.submittedAt?.toISOString() ?? null,
      submittedBy: personOf(m.submittedById),
      approvedAt: m.approvedAt?.toISOString() ?? null,
      approvedBy: personOf(m.approvedById),
    },
    certificates: await listMeasurementCertificates(db, m.id),
  };
}

/* --------------------------------- changes -------------------------------- */

/** The measurement row, locked for the rest of the transaction. */
async function lockMeasurement(tx: Queryable, measurementId: string): Promise<MeasurementRow> {
  const [row] = await tx.select().from(measurements).where(eq(measurements.id, measurementId)).for('update');
  if (!row) throw measurementNotFound(measurementId);
  return row;
}

export async function updateMeasurement(db: Database, measurementId: string, input: UpdateMeasurementInput, actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    const row = await lockMeasurement(tx, measurementId);
    if (!canEditSetup(row.status)) {
      throw new HttpError(HttpStatus.CONFLICT, `Measurement ${row.number} is ${row.status}; its details can no longer change.`);
    }
    const changes = Object.fromEntries(Object.entries(input).filter(([, value]) => value !== undefined));
    await tx
      .update(measurements)
      .set({ ...changes, updatedAt: new Date() })
      .where(eq(measurements.id, measurementId));
    await tx.insert(auditEvents).values({
      actorId: actor.actorId,
      action: 'measurement.updated',
      subjectType: 'measurement',
      subjectId: measurementId,
      details: { number: row.number, changes },
      ip: actor.ip ?? null,
    });
  });
}

async function hasAnalyses(tx: Queryable, measurementId: string): Promise<boolean> {
  const [run] = await tx.select({ id: analysisRuns.id }).from(analysisRuns).where(eq(analysisRuns.measurementId, measurementId)).limit(1);
  return Boolean(run);
}

/** Set-up problems of the measurement's sweeps after a change, as 400 fields. */
async function checkSweepSet(tx: Queryable, measurement: MeasurementRow, nextSweeps: SweepSetup[]): Promise<void> {
  const [lens] = await tx.select({ nominalFocalLengthMm: lenses.nominalFocalLengthMm }).from(lenses).where(eq(lenses.id, measurement.lensId));
  invariant(lens, `measurement ${measurement.id} has its lens`);
  const problems = measurementSetupProblems(
    { method: measurement.method, collimatorId: measurement.collimatorId, auxiliaryLensId: measurement.auxiliaryLensId, sweeps: nextSweeps },
    lens,
  );
  if (problems.length > 0) throw fieldProblems(problemsToFields(problems));
}

function sweepSetupOf(row: SweepRow): SweepSetup {
  return { moving: row.moving, objectPositionMm: row.objectPositionMm, lensPositionMm: row.lensPositionMm, sensorPositionMm: row.sensorPositionMm };
}

function refuseFrameChange(row: MeasurementRow, what: string): void {
  const refusal = frameChangeRefusal({ measurementNumber: row.number, measurementStatus: row.status }, what);
  if (refusal) throw new HttpError(HttpStatus.CONFLICT, refusal);
}

export async function createSweep(db: Database, measurementId: string, input: SweepSetup, actor: Actor): Promise<SweepDetail> {
  return db.transaction(async (tx) => {
    const measurement = await lockMeasurement(tx, measurementId);
    refuseFrameChange(measurement, 'adding a sweep');
    const existing = await tx.select().from(sweeps).where(eq(sweeps.measurementId, measurementId)).orderBy(asc(sweeps.position));
    await checkSweepSet(tx, measurement, [...existing.map(sweepSetupOf), input]);
    const position = existing.length === 0 ? 0 : existing[existing.length - 1].position + 1;
    const [created] = await tx
      .insert(sweeps)
      .values({
        measurementId,
        position,
        moving: input.moving,
        objectPositionMm: input.objectPositionMm ?? null,
        lensPositionMm: input.lensPositionMm ?? null,
        sensorPositionMm: input.sensorPositionMm ?? null,
      })
      .returning();
    await recordMeasurementChange(tx, { measurementId: measurementId, actor, action: 'sweep.created', details: { number: measurement.number, sweepId: created.id, position } });
    return toSweepDetail(created, []);
  });
}

async function lockSweep(tx: Queryable, sweepId: string): Promise<{ sweep: SweepRow; measurement: MeasurementRow; all: SweepRow[] }> {
  const [found] = await tx.select({ measurementId: sweeps.measurementId }).from(sweeps).where(eq(sweeps.id, sweepId));
  if (!found) throw new HttpError(HttpStatus.NOT_FOUND, `There is no sweep with id ${sweepId}.`);
  const measurement = await lockMeasurement(tx, found.measurementId);
  const all = await tx.select().from(sweeps).where(eq(sweeps.measurementId, measurement.id)).orderBy(asc(sweeps.position));
  const sweep = all.find((s) => s.id === sweepId);
  if (!sweep) throw new HttpError(HttpStatus.NOT_FOUND, `There is no sweep with id ${sweepId}.`);
  return { sweep, measurement, all };
}

export async function updateSweep(
  db: Database,
  sweepId: string,
  input: Partial<Pick<SweepSetup, 'objectPositionMm' | 'lensPositionMm' | 'sensorPositionMm'>>,
  actor: Actor,
): Promise<SweepDetail> {
  return db.transaction(async (tx) => {
    const { sweep, measurement, all } = await lockSweep(tx, sweepId);
    refuseFrameChange(measurement, 'changing a sweep');
    const changes = Object.fromEntries(Object.entries(input).filter(([, value]) => value !== undefined));
    const next = { ...sweepSetupOf(sweep), ...changes };
    await checkSweepSet(
      tx,
      measurement,
      all.map((s) => (s.id === sweepId ? next : sweepSetupOf(s))),
    );
    const [updated] = await tx.update(sweeps).set(changes).where(eq(sweeps.id, sweepId)).returning();
    await recordMeasurementChange(tx, { measurementId: measurement.id, actor, action: 'sweep.updated', details: { number: measurement.number, sweepId, changes } });
    const frameRows = await framesBySweep(tx, [sweepId]);
    return toSweepDetail(updated, frameRows.get(sweepId) ?? []);
  });
}

/** Deletes a sweep and its frames' objects; only before any analysis of the measurement. */
export async function deleteSweep(deps: StoreFrameDeps, sweepId: string, actor: Actor): Promise<void> {
  const removed = await deps.db.transaction(async (tx) => {
    const { sweep, measurement, all } = await lockSweep(tx, sweepId);
    refuseFrameChange(measurement, 'deleting a sweep');
    if (await hasAnalyses(tx, measurement.id)) {
      throw new HttpError(
        HttpStatus.CONFLICT,
        `Measurement ${measurement.number} has been analysed; its sweeps are kept with the analyses that used them.`,
      );
    }
    await checkSweepSet(
      tx,
      measurement,
      all.filter((s) => s.id !== sweepId).map(sweepSetupOf),
    );
    const frameRows = await tx.select().from(frames).where(eq(frames.sweepId, sweepId));
    const [location] = await tx
      .select({ organisationId: workOrders.organisationId, workOrderId: workOrders.id })
      .from(lenses)
      .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
      .where(eq(lenses.id, measurement.lensId));
    await tx.delete(sweeps).where(eq(sweeps.id, sweepId));
    await recordMeasurementChange(tx, { measurementId: measurement.id, actor, action: 'sweep.deleted', details: { number: measurement.number, sweepId, position: sweep.position, frames: frameRows.length } });
    return { frameRows, prefix: sweepObjectPrefix({ ...location, measurementId: measurement.id, sweepId }) };
  });
  // Objects go after the rows are gone: a failure then leaves an orphan object, never a frame without its image.
  for (const row of removed.frameRows) await deleteFrameObjects(deps, row);
  for (const leftover of await deps.storage.listObjects(removed.prefix)) await deps.storage.deleteObject(leftover.key);
}

/* --------------------------------- frames --------------------------------- */

async function lockFrame(tx: Queryable, frameId: string) {
  const [found] = await tx
    .select({ frame: frames, measurementId: sweeps.measurementId })
    .from(frames)
    .innerJoin(sweeps, eq(sweeps.id, frames.sweepId))
    .where(eq(frames.id, frameId));
  if (!found) throw frameNotFound(frameId);
  const measurement = await lockMeasurement(tx, found.measurementId);
  return { frame: found.frame, measurement };
}

export function frameNotFound(frameId: string): HttpError {
  return new HttpError(HttpStatus.NOT_FOUND, `There is no frame with id ${frameId}.`);
}

export async function findFrame(db: Queryable, frameId: string): Promise<typeof frames.$inferSelect> {
  const [row] = await db.select().from(frames).where(eq(frames.id, frameId));
  if (!row) throw frameNotFound(frameId);
  return row;
}

/** Marks a frame excluded from (or included in) the next analysis run. */
export async function setFrameExcluded(db: Database, frameId: string, excluded: boolean, actor: Actor) {
  return db.transaction(async (tx) => {
    const { frame, measurement } = await lockFrame(tx, frameId);
    refuseFrameChange(measurement, `${excluded ? 'excluding' : 'including'} frame ${frame.fileName}`);
    const [updated] = await tx.update(frames).set({ excluded }).where(eq(frames.id, frameId)).returning();
    await tx.update(measurements).set({ updatedAt: new Date() }).where(eq(measurements.id, measurement.id));
    await tx.insert(auditEvents).values({
      actorId: actor.actorId,
      action: excluded ? 'frame.excluded' : 'frame.included',
      subjectType: 'measurement',
      subjectId: measurement.id,
      details: { number: measurement.number, frameId, fileName: frame.fileName },
      ip: actor.ip ?? null,
    });
    return toFrame(updated);
  });
}

/** Deletes a frame and its objects; only before any analysis of the measurement. */
export async function deleteFrame(deps: StoreFrameDeps, frameId: string, actor: Actor): Promise<void> {
  const frame = await deps.db.transaction(async (tx) => {
    const { frame, measurement } = await lockFrame(tx, frameId);
    refuseFrameChange(measurement, `deleting frame ${frame.fileName}`);
    if (await hasAnalyses(tx, measurement.id)) {
      throw new HttpError(
        HttpStatus.CONFLICT,
        `Measurement ${measurement.number} has been analysed, so frame ${frame.fileName} is kept with the analyses that used it; exclude it from the next run instead.`,
      );
    }
    await tx.delete(frames).where(eq(frames.id, frameId));
    await recordMeasurementChange(tx, { measurementId: measurement.id, actor, action: 'frame.deleted', details: { number: measurement.number, frameId, fileName: frame.fileName, sha256: frame.sha256 } });
    return frame;
  });
  await deleteFrameObjects(deps, frame);
}

