import { count, desc, eq } from 'drizzle-orm';
import type { Database } from '../../db/client';
import { outboundMail, outboundMailStatusValues } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type { ListOutboundMailQuery, OutboundMailMessage, OutboundMailPage, OutboundMailRow, OutboundMailStatus } from '../../../shared/schemas/admin';

const rowColumns = {
  id: outboundMail.id,
  kind: outboundMail.kind,
  to: outboundMail.toAddresses,
  subject: outboundMail.subject,
  status: outboundMail.status,
  attempts: outboundMail.attempts,
  lastError: outboundMail.lastError,
  createdAt: outboundMail.createdAt,
  sentAt: outboundMail.sentAt,
  nextAttemptAt: outboundMail.nextAttemptAt,
};

function toRow(row: { id: string; kind: string; to: string[]; subject: string; status: OutboundMailStatus; attempts: number; lastError: string | null; createdAt: Date; sentAt: Date | null; nextAttemptAt: Date }): OutboundMailRow {
  return { ...row, createdAt: row.createdAt.toISOString(), sentAt: row.sentAt?.toISOString() ?? null, nextAttemptAt: row.nextAttemptAt.toISOString() };
}

/** The outbox newest first, with how many messages are in each state. */
export async function listOutboundMail(db: Database, query: ListOutboundMailQuery): Promise<OutboundMailPage> {
  const where = query.status ? eq(outboundMail.status, query.status) : undefined;
  const counted = await db.select({ status: outboundMail.status, n: count() }).from(outboundMail).groupBy(outboundMail.status);
  const countsByStatus = Object.fromEntries(outboundMailStatusValues.map((status) => [status, 0])) as Record<OutboundMailStatus, number>;
  for (const row of counted) countsByStatus[row.status] = row.n;
  const total = query.status ? countsByStatus[query.status] : Object.values(countsByStatus).reduce((sum, n) => sum + n, 0);
  const rows = await db
    .select(rowColumns)
    .from(outboundMail)
    .where(where)
    .orderBy(desc(outboundMail.createdAt), desc(outboundMail.id))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return { items: rows.map(toRow), total, page: query.page, pageSize: query.pageSize, countsByStatus };
}

export async function getOutboundMailMessage(db: Database, mailId: string): Promise<OutboundMailMessage> {
  const [row] = await db.select({ ...rowColumns, textBody: outboundMail.textBody }).from(outboundMail).where(eq(outboundMail.id, mailId));
  if (!row) throw new HttpError(HttpStatus.NOT_FOUND, 'There is no outbound message with this id.');
  return { ...toRow(row), textBody: row.textBody };
}
