import type { Database } from '../db/client';
import { auditEvents } from '../db/schema';

export interface AuditEventInput {
  actorId: string | null;
  /** Dotted verb, e.g. `auth.sign-in`. */
  action: string;
  subjectType?: string;
  subjectId?: string;
  details?: Record<string, unknown>;
  ip?: string | null;
}

export async function recordAuditEvent(db: Database, event: AuditEventInput): Promise<void> {
  await db.insert(auditEvents).values({
    actorId: event.actorId,
    action: event.action,
    subjectType: event.subjectType ?? null,
    subjectId: event.subjectId ?? null,
    details: event.details ?? {},
    ip: event.ip ?? null,
  });
}
