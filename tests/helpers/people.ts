/**
 * Test people and organisations.
 *
 * Test files run in parallel (vitest forks) against ONE shared test database,
 * and nothing is truncated between them. So every helper here creates new
 * rows with unique names and e-mail addresses (`…-<random>@test.example`),
 * and a test must only assert on rows it created itself (e.g. "the list
 * contains my person", never "the list has 3 people").
 */
import { randomBytes } from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { AppDeps } from '../../server/deps';
import { organisations, people, personRoles, type OrganisationKind, type Role } from '../../server/db/schema';

export interface TestPerson {
  id: string;
  email: string;
  password: string;
  name: string;
  roles: Role[];
  organisationId: string | null;
}

export function uniqueSuffix(): string {
  return randomBytes(5).toString('hex');
}

export async function createTestOrganisation(
  deps: Pick<AppDeps, 'db'>,
  options: { kind: OrganisationKind; name?: string; postalAddress?: string },
): Promise<{ id: string; name: string; kind: OrganisationKind }> {
  const name = options.name ?? `Test ${options.kind} organisation ${uniqueSuffix()}`;
  // A lab prints its address on every certificate; test labs get an invented one unless told otherwise.
  const postalAddress = options.postalAddress ?? (options.kind === 'lab' ? '1 Test Bench Row\nTestford TF1 1AA, Examplia' : '');
  const [row] = await deps.db.insert(organisations).values({ name, kind: options.kind, postalAddress }).returning();
  return { id: row.id, name: row.name, kind: row.kind };
}

export async function createTestPerson(
  deps: Pick<AppDeps, 'db' | 'passwords'>,
  options: { roles: Role[]; organisationId?: string | null; active?: boolean; password?: string; name?: string; emailPrefix?: string },
): Promise<TestPerson> {
  const suffix = uniqueSuffix();
  const email = `${options.emailPrefix ?? options.roles.join('-') ?? 'person'}-${suffix}@test.example`.toLowerCase();
  const password = options.password ?? `test-password-${suffix}`;
  const name = options.name ?? `Test Person ${suffix}`;
  const [row] = await deps.db
    .insert(people)
    .values({
      email,
      name,
      passwordHash: await deps.passwords.hash(password),
      organisationId: options.organisationId ?? null,
      active: options.active ?? true,
    })
    .returning({ id: people.id });
  if (options.roles.length > 0) {
    await deps.db.insert(personRoles).values(options.roles.map((role) => ({ personId: row.id, role })));
  }
  return { id: row.id, email, password, name, roles: [...options.roles], organisationId: options.organisationId ?? null };
}

export async function setPersonActive(deps: Pick<AppDeps, 'db'>, personId: string, active: boolean): Promise<void> {
  await deps.db.update(people).set({ active }).where(eq(people.id, personId));
}
