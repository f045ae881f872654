import { eq } from 'drizzle-orm';
import { organisations, people, personRoles, type Role } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import type { Database } from '../../db/client';
import type { Queryable } from '../numbering';
import { lockActiveAdmins, refuseRemovingLastAdmin } from './last-admin-guard';

const LAB_ROLES: readonly Role[] = ['technician', 'reviewer', 'admin'];

/** Client accounts belong to a client organisation and hold only the client role; lab staff never hold it. */
export function rolesFitOrganisation(roles: readonly Role[], organisationKind: 'lab' | 'client' | null): string | null {
  const isClient = roles.includes('client');
  if (isClient && roles.some((role) => LAB_ROLES.includes(role))) {
    return 'The client role cannot be combined with technician, reviewer or admin.';
  }
  if (isClient && organisationKind !== 'client') return 'Only a person of a client organisation can hold the client role.';
  if (!isClient && organisationKind === 'client') return 'A person of a client organisation can only hold the client role.';
  return null;
}

export async function findPersonForUpdate(tx: Queryable, personId: string) {
  const [person] = await tx
    .select({ id: people.id, name: people.name, email: people.email, active: people.active, organisationKind: organisations.kind })
    .from(people)
    .leftJoin(organisations, eq(organisations.id, people.organisationId))
    .where(eq(people.id, personId))
    .for('update', { of: people });
  if (!person) throw new HttpError(HttpStatus.NOT_FOUND, 'There is no person with this id.');
  const roleRows = await tx.select({ role: personRoles.role }).from(personRoles).where(eq(personRoles.personId, personId));
  return { ...person, roles: roleRows.map((row) => row.role).sort() as Role[] };
}

/** Replaces a person's roles; audited as `person.roles-changed` with before and after. */
export async function changePersonRoles(db: Database, personId: string, roles: Role[], actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    // The administrators' rows before this person's (see lockActiveAdmins).
    const activeAdminIds = await lockActiveAdmins(tx);
    const person = await findPersonForUpdate(tx, personId);
    const misfit = rolesFitOrganisation(roles, person.organisationKind);
    if (misfit) throw new HttpError(HttpStatus.CONFLICT, misfit, { roles: misfit });
    const after = [...roles].sort();
    if (person.roles.includes('admin') && !after.includes('admin')) {
      refuseRemovingLastAdmin(activeAdminIds, { personId, actorId: actor.actorId, what: 'remove-admin' });
    }
    if (after.join(',') === person.roles.join(',')) return;
    await tx.delete(personRoles).where(eq(personRoles.personId, personId));
    await tx.insert(personRoles).values(after.map((role) => ({ personId, role })));
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'person.roles-changed',
      subjectType: 'person',
      subjectId: personId,
      details: { email: person.email, before: person.roles, after },
      ip: actor.ip,
    });
  });
}
