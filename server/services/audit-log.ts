import { auditEvents } from '../db/schema';
import type { Queryable } from './numbering';

export interface AuditEventInput {
  actorId: string | null;
  /** Dotted verb, e.g. `auth.sign-in`. */
  action: string;
  subjectType?: string;
  subjectId?: string;
  details?: Record<string, unknown>;
  ip?: string | null;
}

/** Records one audit event, on the pool or inside a caller's transaction. */
export async function recordAuditEvent(db: Queryable, event: AuditEventInput): Promise<void> {
  await db.insert(auditEvents).values({
    actorId: event.actorId,
    action: event.action,
    subjectType: event.subjectType ?? null,
    subjectId: event.subjectId ?? null,
    details: event.details ?? {},
    ip: event.ip ?? null,
  });
}
