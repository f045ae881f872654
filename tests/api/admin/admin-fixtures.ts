import { randomBytes } from 'node:crypto';
import { and, desc, eq, sql } from 'drizzle-orm';
import pg from 'pg';
import type { AppDeps } from '../../../server/deps';
import { applyMigrations } from '../../../server/db/migrate';
import { auditEvents, outboundMail, type OutboundMailKind } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import type { BrowserSession } from '../../helpers/browser-session';

/** A state-changing request as the client sends it (with the CSRF header). */
export function send(session: BrowserSession, method: 'post' | 'put' | 'patch' | 'delete', path: string, body: unknown = {}) {
  return session.agent[method](path).set(CSRF_HEADER_NAME, session.csrfToken).send(body as object);
}

export interface OutboxMessage {
  id: string;
  subject: string;
  textBody: string;
  htmlBody: string;
  toAddresses: string[];
  status: string;
}

/** The newest outbox row of `kind` addressed to `email`, if any. */
export async function latestOutboxMessage(deps: Pick<AppDeps, 'db'>, kind: OutboundMailKind, email: string): Promise<OutboxMessage | null> {
  const [row] = await deps.db
    .select()
    .from(outboundMail)
    .where(and(eq(outboundMail.kind, kind), sql`${email} = any(${outboundMail.toAddresses})`))
    .orderBy(desc(outboundMail.createdAt))
    .limit(1);
  return row ?? null;
}

/** The one-time token in a message's link (`…/invitation/<token>` or `…/password-reset/<token>`). */
export function tokenInLink(message: OutboxMessage, kind: 'invitation' | 'password-reset'): string {
  const match = new RegExp(`/${kind}/([A-Za-z0-9_-]{43})\\b`).exec(message.textBody);
  if (!match) throw new Error(`No ${kind} link in the message text: ${message.textBody}`);
  return match[1];
}

export async function auditEventsAbout(deps: Pick<AppDeps, 'db'>, subjectType: string, subjectId: string) {
  return deps.db
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.subjectType, subjectType), eq(auditEvents.subjectId, subjectId)))
    .orderBy(auditEvents.id);
}

/**
 * A database of its own, migrated, for tests that need to know every row
 * (e.g. "the last active administrator"): the shared test database holds
 * other files' admins. Dropped by `drop()`.
 */
export async function createIsolatedDatabase(sharedUrl: string): Promise<{ url: string; drop: () => Promise<void> }> {
  const name = `paraxia_admin_${randomBytes(4).toString('hex')}`;
  const url = new URL(sharedUrl);
  const adminClient = new pg.Client({ connectionString: sharedUrl });
  await adminClient.connect();
  try {
    await adminClient.query(`create database "${name}"`);
  } finally {
    await adminClient.end();
  }
  url.pathname = `/${name}`;
  await applyMigrations({ databaseUrl: url.toString() });
  return {
    url: url.toString(),
    drop: async () => {
      const client = new pg.Client({ connectionString: sharedUrl });
      await client.connect();
      try {
        await client.query(`drop database if exists "${name}" with (force)`);
      } finally {
        await client.end();
      }
    },
  };
}
