import { asc, eq, sql, type SQL } from 'drizzle-orm';
import type { Database } from '../db/client';
import { organisations, people, type OrganisationKind, type Role } from '../db/schema';

/** The signed-in person as the API returns it (`user` in /api/auth/*). */
export interface SessionUser {
  id: string;
  email: string;
  name: string;
  roles: Role[];
  organisation: { id: string; name: string; kind: OrganisationKind } | null;
}

export interface PersonWithCredentials extends SessionUser {
  active: boolean;
  passwordHash: string;
}

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

/** A person's roles as a sorted text array (empty when none). */
export const rolesOfPerson = sql<Role[]>`coalesce((select array_agg(pr.role::text order by pr.role) from person_roles pr where pr.person_id = ${people.id}), '{}'::text[])`;

/** Columns every person listing selects, from `people` left-joined to `organisations`. */
export const personColumns = {
  id: people.id,
  email: people.email,
  name: people.name,
  active: people.active,
  roles: rolesOfPerson,
  organisationId: organisations.id,
  organisationName: organisations.name,
  organisationKind: organisations.kind,
};

/** The person's organisation from those columns; null for a person of none. */
export function organisationOfRow(row: { organisationId: string | null; organisationName: string | null; organisationKind: OrganisationKind | null }) {
  return row.organisationId && row.organisationName && row.organisationKind
    ? { id: row.organisationId, name: row.organisationName, kind: row.organisationKind }
    : null;
}

async function selectPeople(db: Database, where: SQL): Promise<PersonWithCredentials[]> {
  const rows = await db
    .select({ ...personColumns, passwordHash: people.passwordHash })
    .from(people)
    .leftJoin(organisations, eq(organisations.id, people.organisationId))
    .where(where);
  return rows.map((row) => ({
    id: row.id,
    email: row.email,
    name: row.name,
    active: row.active,
    passwordHash: row.passwordHash,
    roles: row.roles,
    organisation: organisationOfRow(row),
  }));
}

export async function findPersonByEmail(db: Database, email: string): Promise<PersonWithCredentials | null> {
  const [person] = await selectPeople(db, eq(people.email, normaliseEmail(email)));
  return person ?? null;
}

export async function findPersonById(db: Database, id: string): Promise<PersonWithCredentials | null> {
  const [person] = await selectPeople(db, eq(people.id, id));
  return person ?? null;
}

export function toSessionUser(person: PersonWithCredentials): SessionUser {
  return { id: person.id, email: person.email, name: person.name, roles: person.roles, organisation: person.organisation };
}

