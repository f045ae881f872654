import { and, asc, desc, eq, gte, ilike, inArray, lte, or, sql, type SQL } from 'drizzle-orm';
import type {
  CreateWorkOrderInput,
  ListWorkOrdersQuery,
  OrganisationKind,
  OrganisationSummary,
  UpdateWorkOrderInput,
  WorkOrderDetail,
  WorkOrderListItem,
  WorkOrderListResponse,
  WorkOrderSortField,
} from '../../shared/schemas/work-orders';
import type { Database } from '../db/client';
import { organisations, people, workOrders } from '../db/schema';
import { HttpError } from '../http-error';
import { HttpStatus } from '../http-status';
import { invariant } from '../invariant';
import { containsPattern, recordAuditEventWithin, visibleOrganisationOf, workOrderNotFound, type Actor, type Viewer } from './catalogue-queries';
import { lensSummariesOfWorkOrder } from './lenses';
import { allocateNumber } from './numbering';

export async function listOrganisations(db: Database, filter: { kind?: OrganisationKind }): Promise<OrganisationSummary[]> {
  return db
    .select({ id: organisations.id, name: organisations.name, kind: organisations.kind })
    .from(organisations)
    .where(filter.kind ? eq(organisations.kind, filter.kind) : undefined)
    .orderBy(asc(organisations.name));
}

const lensCountSql = sql<number>`(select count(*)::int from lenses l where l.work_order_id = ${workOrders.id})`;
const measurementCountSql = sql<number>`(select count(*)::int from measurements m join lenses l on l.id = m.lens_id where l.work_order_id = ${workOrders.id})`;

const listColumns = {
  id: workOrders.id,
  number: workOrders.number,
  title: workOrders.title,
  clientReference: workOrders.clientReference,
  organisationId: organisations.id,
  organisationName: organisations.name,
  status: workOrders.status,
  dueDate: workOrders.dueDate,
  decisionRule: workOrders.decisionRule,
  lensCount: lensCountSql,
  measurementCount: measurementCountSql,
  createdAt: workOrders.createdAt,
};

interface ListRow {
  id: string;
  number: string;
  title: string;
  clientReference: string | null;
  organisationId: string;
  organisationName: string;
  status: WorkOrderListItem['status'];
  dueDate: string | null;
  decisionRule: WorkOrderListItem['decisionRule'];
  lensCount: number;
  measurementCount: number;
  createdAt: Date;
}

function toListItem(row: ListRow): WorkOrderListItem {
  return {
    id: row.id,
    number: row.number,
    title: row.title,
    clientReference: row.clientReference,
    organisation: { id: row.organisationId, name: row.organisationName },
    status: row.status,
    dueDate: row.dueDate,
    decisionRule: row.decisionRule,
    lensCount: Number(row.lensCount),
    measurementCount: Number(row.measurementCount),
    createdAt: row.createdAt.toISOString(),
  };
}

const SORT_COLUMNS: Record<WorkOrderSortField, SQL> = {
  number: sql`${workOrders.number}`,
  dueDate: sql`${workOrders.dueDate}`,
  createdAt: sql`${workOrders.createdAt}`,
  // The enum sorts in its declared order, which is the order of the work.
  status: sql`${workOrders.status}`,
  organisation: sql`${organisations.name}`,
};

/** The whitelisted sort, then number and id so that pages never overlap; orders without a due date come last either way. */
async function countsOfWorkOrders(db: Database, workOrderIds: string[]): Promise<Map<string, { lensCount: number; measurementCount: number }>> {
  if (workOrderIds.length === 0) return new Map();
  const result = await db.execute<{ work_order_id: string; lens_count: number; measurement_count: number }>(sql`
    select l.work_order_id, count(distinct l.id)::int as lens_count, count(m.id)::int as measurement_count
    from lenses l left join measurements m on m.lens_id = l.id
    where l.work_order_id in ${workOrderIds}
    group by l.work_order_id`);
  return new Map(result.rows.map((row) => [row.work_order_id, { lensCount: row.lens_count, measurementCount: row.measurement_count }]));
}

function orderByFor(sort: WorkOrderSortField, order: 'asc' | 'desc'): SQL[] {
  const direction = order === 'asc' ? asc : desc;
  const primary = sort === 'dueDate' ? sql`${SORT_COLUMNS.dueDate} ${sql.raw(order)} nulls last` : direction(SORT_COLUMNS[sort]);
  return [primary, direction(workOrders.number), asc(workOrders.id)];
}

export async function listWorkOrders(db: Database, query: ListWorkOrdersQuery, viewer: Viewer): Promise<WorkOrderListResponse> {
  const conditions: (SQL | undefined)[] = [];
  const visibleOrganisation = visibleOrganisationOf(viewer);
  if (visibleOrganisation !== null) conditions.push(visibleOrganisation === '' ? sql`false` : eq(workOrders.organisationId, visibleOrganisation));
  if (query.organisationId) conditions.push(eq(workOrders.organisationId, query.organisationId));
  if (query.status && query.status.length > 0) conditions.push(inArray(workOrders.status, query.status));
  if (query.dueBefore) conditions.push(lte(workOrders.dueDate, query.dueBefore));
  if (query.dueAfter) conditions.push(gte(workOrders.dueDate, query.dueAfter));
  if (query.q) {
    const pattern = containsPattern(query.q);
    conditions.push(
      or(
        ilike(workOrders.number, pattern),
        ilike(workOrders.title, pattern),
        ilike(workOrders.clientReference, pattern),
        ilike(organisations.name, pattern),
        sql`exists (select 1 from lenses l where l.work_order_id = ${workOrders.id} and (l.identifier ilike ${pattern} or l.part_number ilike ${pattern}))`,
      ),
    );
  }
  const where = and(...conditions);
  const sort = query.sort ?? 'createdAt';
  const order = query.order ?? (sort === 'createdAt' ? 'desc' : 'asc');

  const [{ total }] = await db
    .select({ total: sql<number>`count(*)::int` })
    .from(workOrders)
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .where(where);
  // The page first, then the counts for its rows only: counted in the select list, PostgreSQL would count every matching row before sorting.
  const { lensCount: _lensCount, measurementCount: _measurementCount, ...pageColumns } = listColumns;
  const rows = await db
    .select(pageColumns)
    .from(workOrders)
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .where(where)
    .orderBy(...orderByFor(sort, order))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const counts = await countsOfWorkOrders(db, rows.map((row) => row.id));
  const items = rows.map((row) => toListItem({ ...row, ...(counts.get(row.id) ?? { lensCount: 0, measurementCount: 0 }) }));
  return { items, total: Number(total), page: query.page, pageSize: query.pageSize };
}

/** The work order as `viewer` may see it; another organisation's order is "not found", so ids cannot be probed. */
export async function getWorkOrder(db: Database, workOrderId: string, viewer: Viewer): Promise<WorkOrderDetail> {
  const [row] = await db
    .select({
      ...listColumns,
      notes: workOrders.notes,
      updatedAt: workOrders.updatedAt,
      createdById: people.id,
      createdByName: people.name,
    })
    .from(workOrders)
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .leftJoin(people, eq(people.id, workOrders.createdById))
    .where(eq(workOrders.id, workOrderId));
  const visibleOrganisation = visibleOrganisationOf(viewer);
  if (!row || (visibleOrganisation !== null && row.organisationId !== visibleOrganisation)) throw workOrderNotFound(workOrderId);
  return {
    ...toListItem(row),
    notes: row.notes,
    updatedAt: row.updatedAt.toISOString(),
    createdBy: row.createdById && row.createdByName ? { id: row.createdById, name: row.createdByName } : null,
    lenses: await lensSummariesOfWorkOrder(db, workOrderId),
  };
}

export async function createWorkOrder(
  db: Database,
  input: CreateWorkOrderInput,
  actor: Actor,
  options: { year?: number } = {},
): Promise<string> {
  const [organisation] = await db
    .select({ id: organisations.id, kind: organisations.kind, name: organisations.name })
    .from(organisations)
    .where(eq(organisations.id, input.organisationId));
  if (!organisation) {
    const message = `Field "organisationId" names no organisation (${input.organisationId}).`;
    throw new HttpError(HttpStatus.BAD_REQUEST, message, { organisationId: message });
  }
  if (organisation.kind !== 'client') {
    const message = `Field "organisationId" must name a client organisation; "${organisation.name}" is the lab itself.`;
    throw new HttpError(HttpStatus.BAD_REQUEST, message, { organisationId: message });
  }
  const year = options.year ?? new Date().getFullYear();
  return db.transaction(async (tx) => {
    const number = await allocateNumber(tx, 'work-order', year);
    const [row] = await tx
      .insert(workOrders)
      .values({
        number,
        organisationId: input.organisationId,
        title: input.title,
        clientReference: input.clientReference ?? null,
        dueDate: input.dueDate ?? null,
        decisionRule: input.decisionRule,
        notes: input.notes ?? null,
        createdById: actor.actorId,
      })
      .returning({ id: workOrders.id });
    await recordAuditEventWithin(tx, {
      actorId: actor.actorId,
      action: 'work-order.created',
      subjectType: 'work-order',
      subjectId: row.id,
      details: { number, organisationId: input.organisationId, title: input.title },
      ip: actor.ip,
    });
    return row.id;
  });
}

export async function updateWorkOrder(db: Database, workOrderId: string, input: UpdateWorkOrderInput, actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    const [existing] = await tx.select().from(workOrders).where(eq(workOrders.id, workOrderId)).for('update');
    if (!existing) throw workOrderNotFound(workOrderId);
    const changes: Partial<typeof workOrders.$inferInsert> = {};
    if (input.title !== undefined) changes.title = input.title;
    if (input.clientReference !== undefined) changes.clientReference = input.clientReference;
    if (input.dueDate !== undefined) changes.dueDate = input.dueDate;
    if (input.decisionRule !== undefined && input.decisionRule !== existing.decisionRule) {
      // A reviewed or certified result was decided under the rule it was analysed with; changing it would make the record disagree with itself.
      const locked = await tx.execute<{ number: string; status: string }>(sql`
        select m.number, m.status from measurements m join lenses l on l.id = m.lens_id
        where l.work_order_id = ${workOrderId} and m.status in ('submitted', 'approved', 'certified')
        order by m.number limit 1`);
      const [first] = locked.rows;
      if (first) {
        const message = `Field "decisionRule" cannot change: measurement ${first.number} of this work order is ${first.status} under the ${existing.decisionRule} rule.`;
        throw new HttpError(HttpStatus.CONFLICT, message, { decisionRule: message });
      }
      changes.decisionRule = input.decisionRule;
    }
    if (input.notes !== undefined) changes.notes = input.notes;
    if (input.status !== undefined) changes.status = input.status;
    const changedFields = Object.keys(changes).filter(
      (key) => changes[key as keyof typeof changes] !== existing[key as keyof typeof existing],
    );
    const [row] = await tx
      .update(workOrders)
      .set({ ...changes, updatedAt: new Date() })
      .where(eq(workOrders.id, workOrderId))
      .returning({ id: workOrders.id });
    invariant(row, `work order ${workOrderId} vanished during its update`);
    await recordAuditEventWithin(tx, {
      actorId: actor.actorId,
      action: 'work-order.updated',
      subjectType: 'work-order',
      subjectId: workOrderId,
      details: {
        number: existing.number,
        changedFields,
        before: Object.fromEntries(changedFields.map((key) => [key, existing[key as keyof typeof existing]])),
        after: Object.fromEntries(changedFields.map((key) => [key, changes[key as keyof typeof changes]])),
      },
      ip: actor.ip,
    });
  });
}
