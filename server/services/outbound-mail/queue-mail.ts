import { outboundMail, type OutboundMailKind } from '../../db/schema';
import { invariant } from '../../invariant';
import type { Queryable } from '../numbering';

export interface QueuedMailInput {
  kind: OutboundMailKind;
  to: string[];
  subject: string;
  text: string;
  html: string;
  /** What the mail is about, e.g. ('certificate', id). */
  subjectType?: string;
  subjectId?: string;
}

/**
 * Writes one message to the outbox, on the pool or inside the caller's
 * transaction (so a rolled-back action sends nothing). The dispatcher sends
 * it afterwards; nothing here talks to SMTP. Returns the outbox row's id, or
 * null when there is nobody to send to.
 */
export async function queueMail(db: Queryable, mail: QueuedMailInput): Promise<string | null> {
  const to = [...new Set(mail.to.map((address) => address.trim().toLowerCase()).filter((address) => address.length > 0))];
  if (to.length === 0) return null;
  invariant(mail.subject.trim().length > 0, 'a queued mail needs a subject');
  const [row] = await db
    .insert(outboundMail)
    .values({
      kind: mail.kind,
      toAddresses: to,
      subject: mail.subject,
      textBody: mail.text,
      htmlBody: mail.html,
      subjectType: mail.subjectType ?? null,
      subjectId: mail.subjectId ?? null,
    })
    .returning({ id: outboundMail.id });
  return row.id;
}
