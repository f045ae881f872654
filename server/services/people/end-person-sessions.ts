import { sql } from 'drizzle-orm';
import type { Queryable } from '../numbering';

/**
 * Deletes the stored sessions of one person (connect-pg-simple keeps the
 * session JSON, with `personId`, in http_sessions.sess), except `keepSessionId`.
 * Returns how many were ended.
 */
export async function endPersonSessions(db: Queryable, personId: string, options: { keepSessionId?: string } = {}): Promise<number> {
  const result = await db.execute(
    options.keepSessionId
      ? sql`delete from http_sessions where (sess->>'personId') = ${personId} and sid <> ${options.keepSessionId}`
      : sql`delete from http_sessions where (sess->>'personId') = ${personId}`,
  );
  return result.rowCount ?? 0;
}
