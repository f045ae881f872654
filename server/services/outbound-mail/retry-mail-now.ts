import { and, eq, inArray } from 'drizzle-orm';
import { outboundMail } from '../../db/schema';
import type { Queryable } from '../numbering';

/**
 * An admin's "try again now": a retrying or failed message becomes due at
 * once for the dispatcher. A failed one gets one more attempt (if it fails
 * again it is failed again). Returns false when the message does not exist
 * or is not waiting for a retry (already sent, queued or being sent).
 */
export async function retryMailNow(db: Queryable, mailId: string): Promise<boolean> {
  const rows = await db
    .update(outboundMail)
    .set({ status: 'retrying', nextAttemptAt: new Date() })
    .where(and(eq(outboundMail.id, mailId), inArray(outboundMail.status, ['retrying', 'failed'])))
    .returning({ id: outboundMail.id });
  return rows.length > 0;
}
