import { and, eq, sql } from 'drizzle-orm';
import type { AppDeps } from '../../deps';
import { outboundMail } from '../../db/schema';
import { MAIL_SENDING_LEASE_MS, MAX_MAIL_ATTEMPTS, mailRetryDelayMs } from './mail-backoff';

export interface DispatchDueMailOptions {
  /** Most messages claimed in one call (default 20). */
  limit?: number;
  /** The dispatcher's clock (default: now). */
  now?: Date;
  /** Only these outbox rows, when given (an admin's "send now", or a test that must not touch other rows). */
  mailIds?: readonly string[];
}

export interface DispatchDueMailResult {
  sent: number;
  retried: number;
  failed: number;
}

type ClaimedMail = {
  id: string;
  to_addresses: string[];
  subject: string;
  text_body: string;
  html_body: string;
  attempts: number;
};

/** The SMTP error as one line for admins, without a stack. */
function describeSendError(error: unknown): string {
  const message = error instanceof Error ? error.message : String(error);
  const code = (error as { code?: unknown; responseCode?: unknown } | null)?.code;
  const oneLine = message.replace(/\s+/g, ' ').trim().slice(0, 500);
  return typeof code === 'string' && !oneLine.includes(code) ? `${code}: ${oneLine}` : oneLine;
}

/**
 * Sends the outbox messages that are due: queued or retrying ones whose
 * next attempt has come, and 'sending' ones whose dispatcher died (its lease
 * ran out). Rows are claimed with FOR UPDATE SKIP LOCKED and committed as
 * 'sending' before any SMTP traffic, so parallel dispatchers (in one process
 * or many) never send a row twice. A failure waits 30 s, 2 min, 10 min, 1 h;
 * the fifth failure marks the row failed.
 */
export async function dispatchDueMail(
  deps: Pick<AppDeps, 'db' | 'mailer' | 'log'>,
  options: DispatchDueMailOptions = {},
): Promise<DispatchDueMailResult> {
  const limit = options.limit ?? 20;
  const now = options.now ?? new Date();
  const leaseEnds = new Date(now.getTime() + MAIL_SENDING_LEASE_MS);
  if (options.mailIds && options.mailIds.length === 0) return { sent: 0, retried: 0, failed: 0 };
  const onlyIds = options.mailIds
    ? sql`and id in (${sql.join(options.mailIds.map((id) => sql`${id}::uuid`), sql`, `)})`
    : sql``;

  // While 'sending', next_attempt_at holds the end of the claim's lease. PostgreSQL keeps microseconds and a JavaScript
  // clock milliseconds, so a row queued in the same millisecond as `now` is compared at millisecond precision.
  const claimed = await deps.db.execute<ClaimedMail>(sql`
    update outbound_mail set status = 'sending', attempts = attempts + 1, next_attempt_at = ${leaseEnds}
    where id in (
      select id from outbound_mail
      where status in ('queued', 'retrying', 'sending') and date_trunc('milliseconds', next_attempt_at) <= ${now} ${onlyIds}
      order by next_attempt_at, created_at
      limit ${limit}
      for update skip locked)
    returning id, to_addresses, subject, text_body, html_body, attempts`);

  const result: DispatchDueMailResult = { sent: 0, retried: 0, failed: 0 };
  for (const mail of claimed.rows) {
    const stillOurs = and(eq(outboundMail.id, mail.id), eq(outboundMail.status, 'sending'), eq(outboundMail.attempts, mail.attempts));
    try {
      const sent = await deps.mailer.send({ to: mail.to_addresses, subject: mail.subject, text: mail.text_body, html: mail.html_body });
      await deps.db
        .update(outboundMail)
        .set({ status: 'sent', sentAt: new Date(), messageId: sent.messageId, lastError: sent.rejected.length > 0 ? `Refused by the relay: ${sent.rejected.join(', ')}` : null })
        .where(stillOurs);
      result.sent += 1;
    } catch (error) {
      const lastError = describeSendError(error);
      const givesUp = mail.attempts >= MAX_MAIL_ATTEMPTS;
      await deps.db
        .update(outboundMail)
        .set({
          status: givesUp ? 'failed' : 'retrying',
          lastError,
          nextAttemptAt: givesUp ? now : new Date(now.getTime() + mailRetryDelayMs(mail.attempts)),
        })
        .where(stillOurs);
      if (givesUp) {
        result.failed += 1;
        deps.log.error('An e-mail could not be sent and will not be retried.', { mailId: mail.id, attempts: mail.attempts, lastError });
      } else {
        result.retried += 1;
        deps.log.warn('An e-mail could not be sent; it will be retried.', { mailId: mail.id, attempts: mail.attempts, lastError });
      }
    }
  }
  return result;
}
