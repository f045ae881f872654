import { count, desc, eq } from 'drizzle-orm';
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

export const AUDIT_EXPORT_MAX_ROWS = 100_000;

/** Every event matching the filter, newest first (capped), for the CSV export. */
export async function selectAuditEventsForExport(db: Database, filter: AuditFilter): Promise<AuditEventRow[]> {
  const rows = await db
    .select(columns)
    .from(auditEvents)
    .leftJoin(people, eq(people.id, auditEvents.actorId))
    .where(auditWhere(filter))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(AUDIT_EXPORT_MAX_ROWS);
  return rows.map(toAuditRow);
}
