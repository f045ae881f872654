import { and, eq, isNull } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { people, passwordResets } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type { PasswordResetLinkView } from '../../../shared/schemas/admin';
import { recordAuditEvent } from '../audit-log';
import { queueMail } from '../outbound-mail/queue-mail';
import type { PasswordHasher } from '../passwords';
import { normaliseEmail } from '../people';
import { endPersonSessions } from './end-person-sessions';
import { findLabName } from './find-lab-name';
import { createLinkToken, hashLinkToken } from './link-token';
import { passwordResetMail } from './password-reset-mail';

export interface PasswordResetSettings {
  baseUrl: string;
  expiryMinutes: number;
}

export const RESET_LINK_NOT_FOUND_MESSAGE = 'This password link is not valid; copy the whole link from the e-mail, or ask for a new one.';
export const RESET_LINK_USED_MESSAGE = 'This password link has already been used; ask for a new one if you need to change your password again.';
export const RESET_LINK_EXPIRED_MESSAGE = 'This password link has expired; ask for a new one from the sign-in page.';

/**
 * Queues a reset link for an active person, inside one transaction with its
 * audit event. `by` says who asked: an administrator (their id) or the person
 * through the public form (null). Returns false when there is nobody to send
 * to, which the public form must not reveal.
 */
export async function requestPasswordReset(
  db: Database,
  target: { personId: string } | { email: string },
  by: { actorId: string | null; ip: string | null },
  settings: PasswordResetSettings,
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [person] = await tx
      .select({ id: people.id, name: people.name, email: people.email, active: people.active })
      .from(people)
      .where('personId' in target ? eq(people.id, target.personId) : eq(people.email, normaliseEmail(target.email)));
    if ('personId' in target && !person) throw new HttpError(HttpStatus.NOT_FOUND, 'There is no person with this id.');
    if ('personId' in target && !person.active) {
      throw new HttpError(HttpStatus.CONFLICT, 'This account is deactivated; reactivate it before sending a password link.');
    }
    if (!person || !person.active) {
      await recordAuditEvent(tx, {
        actorId: null,
        action: 'password-reset.refused',
        subjectType: person ? 'person' : undefined,
        subjectId: person?.id,
        details: { email: 'email' in target ? normaliseEmail(target.email) : null, reason: person ? 'inactive-account' : 'unknown-email' },
        ip: by.ip,
      });
      return false;
    }

    const { token, tokenHash } = createLinkToken();
    const expiresAt = new Date(Date.now() + settings.expiryMinutes * 60_000);
    const [reset] = await tx
      .insert(passwordResets)
      .values({ personId: person.id, tokenHash, expiresAt, requestedById: by.actorId })
      .returning({ id: passwordResets.id });
    const mail = passwordResetMail({
      name: person.name,
      labName: await findLabName(tx),
      link: `${settings.baseUrl}/password-reset/${token}`,
      expiresInMinutes: settings.expiryMinutes,
      requestedByAdmin: by.actorId !== null,
    });
    await queueMail(tx, { kind: 'password-reset', to: [person.email], ...mail, subjectType: 'person', subjectId: person.id });
    await recordAuditEvent(tx, {
      actorId: by.actorId,
      action: 'password-reset.requested',
      subjectType: 'person',
      subjectId: person.id,
      details: { email: person.email, resetId: reset.id, by: by.actorId ? 'admin' : 'self' },
      ip: by.ip,
    });
    return true;
  });
}

async function findUsableReset(db: Pick<Database, 'select'>, token: string) {
  const [row] = await db
    .select({
      id: passwordResets.id,
      personId: passwordResets.personId,
      expiresAt: passwordResets.expiresAt,
      usedAt: passwordResets.usedAt,
      name: people.name,
      email: people.email,
      active: people.active,
    })
    .from(passwordResets)
    .innerJoin(people, eq(people.id, passwordResets.personId))
    .where(eq(passwordResets.tokenHash, hashLinkToken(token)));
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, RESET_LINK_NOT_FOUND_MESSAGE);
  if (row.usedAt) throw new HttpError(HttpStatus.GONE, RESET_LINK_USED_MESSAGE);
  if (row.expiresAt.getTime() <= Date.now()) throw new HttpError(HttpStatus.GONE, RESET_LINK_EXPIRED_MESSAGE);
  if (!row.active) throw new HttpError(HttpStatus.GONE, 'This account has been deactivated; ask your administrator.');
  return row;
}

export async function readPasswordResetLink(db: Database, token: string): Promise<PasswordResetLinkView> {
  const row = await findUsableReset(db, token);
  return { name: row.name, email: row.email, labName: await findLabName(db), expiresAt: row.expiresAt.toISOString() };
}

/**
 * Sets the new password, uses up this link and any other open link of the
 * person, and ends all their sessions. Returns the person's id so the caller
 * can sign this browser in.
 */
export async function completePasswordReset(
  db: Database,
  passwords: PasswordHasher,
  token: string,
  password: string,
  ip: string | null,
): Promise<string> {
  const passwordHash = await passwords.hash(password);
  return db.transaction(async (tx) => {
    const [locked] = await tx
      .select({ id: passwordResets.id })
      .from(passwordResets)
      .where(eq(passwordResets.tokenHash, hashLinkToken(token)))
      .for('update');
    if (!locked) throw new HttpError(HttpStatus.NOT_FOUND, RESET_LINK_NOT_FOUND_MESSAGE);
    const reset = await findUsableReset(tx, token);
    const now = new Date();
    await tx.update(people).set({ passwordHash }).where(eq(people.id, reset.personId));
    await tx
      .update(passwordResets)
      .set({ usedAt: now })
      .where(and(eq(passwordResets.personId, reset.personId), isNull(passwordResets.usedAt)));
    const sessionsEnded = await endPersonSessions(tx, reset.personId);
    await recordAuditEvent(tx, {
      actorId: reset.personId,
      action: 'password-reset.completed',
      subjectType: 'person',
      subjectId: reset.personId,
      details: { email: reset.email, resetId: reset.id, sessionsEnded },
      ip,
    });
    return reset.personId;
  });
}
