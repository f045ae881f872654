import { sql } from 'drizzle-orm';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type { Queryable } from '../numbering';

const activeAdminsQuery = (lock: boolean) => sql`
  select p.id from people p
  join person_roles pr on pr.person_id = p.id and pr.role = 'admin'
  where p.active
  order by p.id
  ${lock ? sql`for update of p` : sql``}`;

/**
 * Locks the active administrators' rows until the caller's transaction ends
 * and returns who is an active administrator once the locks are held. Call
 * it before locking any one person's row: every transaction then takes the
 * administrators' rows first and in id order, so two admins removing each
 * other at the same moment queue instead of deadlocking. The ids come from a
 * second statement, which (in READ COMMITTED) sees what a transaction that
 * held those rows committed, role changes included.
 */
export async function lockActiveAdmins(tx: Queryable): Promise<string[]> {
  await tx.execute(activeAdminsQuery(true));
  const result = await tx.execute<{ id: string }>(activeAdminsQuery(false));
  return result.rows.map((row) => row.id);
}

/** Refuses a change that would leave no active administrator (nobody could then manage people). */
export function refuseRemovingLastAdmin(
  activeAdminIds: readonly string[],
  change: { personId: string; actorId: string; what: 'remove-admin' | 'deactivate' },
): void {
  if (!activeAdminIds.includes(change.personId) || activeAdminIds.length > 1) return;
  const own = change.personId === change.actorId;
  const action = change.what === 'deactivate' ? 'be deactivated' : 'lose the administrator role';
  const message = own
    ? `You are the last active administrator, so your account cannot ${action}; make someone else an administrator first.`
    : `This person is the last active administrator and cannot ${action}; make someone else an administrator first.`;
  throw new HttpError(HttpStatus.CONFLICT, message);
}
