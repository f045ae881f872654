import { sql } from 'drizzle-orm';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type { Queryable } from '../numbering';

/**
 * Refuses a change that would leave no active administrator (nobody could
 * then manage people). Locks the active administrators' rows until the
 * caller's transaction ends, so two admins removing each other at the same
 * moment cannot both succeed.
 */
export async function assertAdminRemains(tx: Queryable, change: { personId: string; actorId: string; what: 'remove-admin' | 'deactivate' }): Promise<void> {
  const result = await tx.execute<{ id: string }>(sql`
    select p.id from people p
    join person_roles pr on pr.person_id = p.id and pr.role = 'admin'
    where p.active
    order by p.id
    for update of p`);
  const activeAdminIds = result.rows.map((row) => row.id);
  if (!activeAdminIds.includes(change.personId) || activeAdminIds.length > 1) return;
  const own = change.personId === change.actorId;
  const action = change.what === 'deactivate' ? 'deactivated' : 'lose the administrator role';
  const message = own
    ? `You are the last active administrator, so your account cannot ${change.what === 'deactivate' ? 'be deactivated' : action}; make someone else an administrator first.`
    : `This person is the last active administrator and cannot ${change.what === 'deactivate' ? 'be deactivated' : action}; make someone else an administrator first.`;
  throw new HttpError(HttpStatus.CONFLICT, message);
}
