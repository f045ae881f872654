import { and, asc, count, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { organisations, people } from '../../db/schema';
import { containsPattern } from '../catalogue-queries';
import { organisationOfRow, personColumns } from '../people';
import type { AdminPersonSummary, ListPeopleQuery, PeoplePage } from '../../../shared/schemas/admin';

/** People for the admin's table: search by name or e-mail, filter by role and active, one page at a time. */
export async function listPeoplePage(db: Database, query: ListPeopleQuery, options: { personId?: string } = {}): Promise<PeoplePage> {
  const conditions: SQL[] = [];
  if (options.personId) conditions.push(eq(people.id, options.personId));
  if (query.q) {
    const pattern = containsPattern(query.q);
    conditions.push(or(ilike(people.name, pattern), ilike(people.email, pattern))!);
  }
  if (query.role) conditions.push(sql`exists (select 1 from person_roles pr where pr.person_id = people.id and pr.role = ${query.role})`);
  if (query.active !== undefined) conditions.push(eq(people.active, query.active));
  const where = conditions.length > 0 ? and(...conditions) : undefined;

  const [{ total }] = await db.select({ total: count() }).from(people).where(where);
  const rows = await db
    .select({
      ...personColumns,
      createdAt: people.createdAt,
      lastSignInAt: people.lastSignInAt,
      deactivatedAt: people.deactivatedAt,
    })
    .from(people)
    .leftJoin(organisations, eq(organisations.id, people.organisationId))
    .where(where)
    .orderBy(asc(people.name), asc(people.email))
    .limit(query.pageSize ?? Number.MAX_SAFE_INTEGER)
    .offset(query.pageSize ? (query.page - 1) * query.pageSize : 0);

  const items: AdminPersonSummary[] = rows.map((row) => ({
    id: row.id,
    email: row.email,
    name: row.name,
    roles: row.roles,
    organisation: organisationOfRow(row),
    active: row.active,
    createdAt: row.createdAt.toISOString(),
    lastSignInAt: row.lastSignInAt?.toISOString() ?? null,
    deactivatedAt: row.deactivatedAt?.toISOString() ?? null,
  }));
  return { people: items, total, page: query.pageSize ? query.page : 1, pageSize: query.pageSize ?? Math.max(total, 1) };
}
