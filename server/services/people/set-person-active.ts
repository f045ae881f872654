import { eq } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people } from '../../db/schema';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import { lockActiveAdmins, refuseRemovingLastAdmin } from './last-admin-guard';
import { findPersonForUpdate } from './change-person-roles';
import { endPersonSessions } from './end-person-sessions';

/**
 * Deactivates or reactivates a person. Deactivation deletes their stored
 * sessions in the same transaction (the session middleware also refuses an
 * inactive person, so a request already in flight cannot revive one).
 */
export async function setPersonActive(db: Database, personId: string, active: boolean, actor: Actor): Promise<void> {
  await db.transaction(async (tx) => {
    // The administrators' rows before this person's (see lockActiveAdmins).
    const activeAdminIds = active ? [] : await lockActiveAdmins(tx);
    const person = await findPersonForUpdate(tx, personId);
    if (person.active === active) return;
    let sessionsEnded = 0;
    if (!active) {
      if (person.roles.includes('admin')) refuseRemovingLastAdmin(activeAdminIds, { personId, actorId: actor.actorId, what: 'deactivate' });
      sessionsEnded = await endPersonSessions(tx, personId);
    }
    await tx
      .update(people)
      .set({ active, deactivatedAt: active ? null : new Date() })
      .where(eq(people.id, personId));
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: active ? 'person.reactivated' : 'person.deactivated',
      subjectType: 'person',
      subjectId: personId,
      details: active ? { email: person.email } : { email: person.email, sessionsEnded },
      ip: actor.ip,
    });
  });
}
