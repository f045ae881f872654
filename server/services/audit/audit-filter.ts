import { and, eq, gte, ilike, lt, or, sql, type SQL } from 'drizzle-orm';
import { auditEvents, people } from '../../db/schema';
import type { AuditFilter } from '../../../shared/schemas/admin';

function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (character) => `\\${character}`);
}

function startOfUtcDay(isoDate: string, addDays = 0): Date {
  const date = new Date(`${isoDate}T00:00:00.000Z`);
  date.setUTCDate(date.getUTCDate() + addDays);
  return date;
}

/** The WHERE clause for an audit filter; `to` is inclusive (the whole UTC day). */
export function auditWhere(filter: AuditFilter): SQL | undefined {
  const conditions: SQL[] = [];
  if (filter.actorId) conditions.push(eq(auditEvents.actorId, filter.actorId));
  if (filter.actor) {
    const pattern = `%${escapeLike(filter.actor)}%`;
    conditions.push(or(ilike(people.name, pattern), ilike(people.email, pattern))!);
  }
  if (filter.action) conditions.push(ilike(auditEvents.action, `${escapeLike(filter.action)}%`));
  if (filter.subjectType) conditions.push(eq(auditEvents.subjectType, filter.subjectType));
  if (filter.subjectId) conditions.push(eq(auditEvents.subjectId, filter.subjectId));
  if (filter.from) conditions.push(gte(auditEvents.at, startOfUtcDay(filter.from)));
  if (filter.to) conditions.push(lt(auditEvents.at, startOfUtcDay(filter.to, 1)));
  if (filter.from && filter.to && filter.from > filter.to) conditions.push(sql`false`);
  return conditions.length > 0 ? and(...conditions) : undefined;
}
