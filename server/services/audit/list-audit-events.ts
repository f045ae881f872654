import { and, count, desc, eq, lte, max, sql } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { auditEvents, people } from '../../db/schema';
import type { AuditEventRow, AuditEventsPage, AuditFilter, ListAuditEventsQuery } from '../../../shared/schemas/admin';
import { auditWhere } from './audit-filter';

const columns = {
  id: auditEvents.id,
  at: auditEvents.at,
  actorId: people.id,
  actorName: people.name,
  actorEmail: people.email,
  action: auditEvents.action,
  subjectType: auditEvents.subjectType,
  subjectId: auditEvents.subjectId,
  details: auditEvents.details,
  ip: auditEvents.ip,
};

type Row = { id: number; at: Date; actorId: string | null; actorName: string | null; actorEmail: string | null; action: string; subjectType: string | null; subjectId: string | null; details: Record<string, unknown>; ip: string | null };

function toAuditRow(row: Row): AuditEventRow {
  return {
    id: row.id,
    at: row.at.toISOString(),
    actor: row.actorId && row.actorName && row.actorEmail ? { id: row.actorId, name: row.actorName, email: row.actorEmail } : null,
    action: row.action,
    subjectType: row.subjectType,
    subjectId: row.subjectId,
    details: row.details,
    ip: row.ip,
  };
}

/** Audit events newest first, one page at a time. */
export async function listAuditEvents(db: Database, query: ListAuditEventsQuery): Promise<AuditEventsPage> {
  const where = auditWhere(query);
  const [{ total }] = await db.select({ total: count() }).from(auditEvents).leftJoin(people, eq(people.id, auditEvents.actorId)).where(where);
  const rows = await db
    .select(columns)
    .from(auditEvents)
    .leftJoin(people, eq(people.id, auditEvents.actorId))
    .where(where)
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return { items: rows.map(toAuditRow), total, page: query.page, pageSize: query.pageSize };
}

/** Rows read from PostgreSQL per step of an export. */
export const AUDIT_EXPORT_BATCH_ROWS = 2_000;

/**
 * Every event matching the filter, newest first, in batches (keyset paging
 * on time and id, so each step is an index range, not an offset), for the
 * streamed CSV export. Only events recorded before the export began are
 * read, so an export never contains its own event nor grows while it runs.
 */
export async function* auditEventBatchesForExport(db: Database, filter: AuditFilter, batchRows = AUDIT_EXPORT_BATCH_ROWS): AsyncGenerator<AuditEventRow[]> {
  const [{ upTo }] = await db.select({ upTo: max(auditEvents.id) }).from(auditEvents);
  if (upTo === null) return;
  // The time as PostgreSQL's text: a JavaScript Date would drop its microseconds and page wrongly.
  let after: { at: string; id: number } | null = null;
  for (;;) {
    const rows: (Row & { atKey: string })[] = await db
      .select({ ...columns, atKey: sql<string>`${auditEvents.at}::text` })
      .from(auditEvents)
      .leftJoin(people, eq(people.id, auditEvents.actorId))
      .where(
        and(
          auditWhere(filter),
          lte(auditEvents.id, upTo),
          after ? sql`(${auditEvents.at}, ${auditEvents.id}) < (${after.at}::timestamptz, ${after.id})` : undefined,
        ),
      )
      .orderBy(desc(auditEvents.at), desc(auditEvents.id))
      .limit(batchRows);
    if (rows.length > 0) yield rows.map(toAuditRow);
    if (rows.length < batchRows) return;
    const last = rows[rows.length - 1];
    after = { at: last.atKey, id: last.id };
  }
}
