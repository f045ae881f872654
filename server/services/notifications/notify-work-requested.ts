import { and, eq, inArray, sql } from 'drizzle-orm';
import { lenses, organisations, people, personRoles, workOrders } from '../../db/schema';
import { invariant } from '../../invariant';
import type { Queryable } from '../numbering';
import { queueMail } from '../outbound-mail/queue-mail';
import { linkUnder, renderMail } from './mail-layout';

export interface WorkRequestedNotice {
  workOrderId: string;
  requestedById: string;
  baseUrl: string;
}

/** The lab's reviewers and admins (active people of the lab organisation), who accept new work. */
export async function labIntakeRecipients(db: Queryable): Promise<string[]> {
  const rows = await db
    .selectDistinct({ email: people.email })
    .from(people)
    .innerJoin(organisations, and(eq(organisations.id, people.organisationId), eq(organisations.kind, 'lab')))
    .innerJoin(personRoles, and(eq(personRoles.personId, people.id), inArray(personRoles.role, ['reviewer', 'admin'])))
    .where(eq(people.active, true));
  return rows.map((row) => row.email);
}

/** Queues "new work requested" to the lab (inside the transaction that created the draft work order). */
export async function notifyWorkRequested(db: Queryable, notice: WorkRequestedNotice): Promise<void> {
  const [row] = await db
    .select({
      number: workOrders.number,
      title: workOrders.title,
      clientReference: workOrders.clientReference,
      dueDate: workOrders.dueDate,
      notes: workOrders.notes,
      organisationName: organisations.name,
      lensCount: sql<number>`(select count(*)::int from ${lenses} where ${lenses.workOrderId} = ${workOrders.id})`,
    })
    .from(workOrders)
    .innerJoin(organisations, eq(organisations.id, workOrders.organisationId))
    .where(eq(workOrders.id, notice.workOrderId));
  invariant(row, `work order ${notice.workOrderId} does not exist`);
  const [requester] = await db.select({ name: people.name, email: people.email }).from(people).where(eq(people.id, notice.requestedById));
  const requesterText = requester ? `${requester.name} <${requester.email}>` : 'A client';
  const lensCount = Number(row.lensCount);

  const facts = [
    { label: 'Work order', value: row.number },
    { label: 'Client', value: row.organisationName },
    { label: 'Requested by', value: requesterText },
    { label: 'Lenses', value: String(lensCount) },
    { label: 'Requested due date', value: row.dueDate ?? 'none given' },
  ];
  if (row.clientReference) facts.push({ label: 'Client reference', value: row.clientReference });
  const { text, html } = renderMail({
    heading: `New work requested by ${row.organisationName}`,
    paragraphs: [
      `${row.organisationName} asks for ${lensCount === 1 ? 'one lens' : `${lensCount} lenses`} to be measured: "${row.title}".`,
      `The request is work order ${row.number}, in status "requested". Check the lenses and tolerances, then open it for the bench.`,
    ],
    facts,
    quote: row.notes ? { attribution: 'Notes from the client', text: row.notes } : undefined,
    links: [{ label: `Open work order ${row.number}`, url: linkUnder(notice.baseUrl, `/work-orders/${notice.workOrderId}`) }],
    footnote: 'Sent by Paraxia to the reviewers and administrators of the laboratory.',
  });
  await queueMail(db, {
    kind: 'work-requested',
    to: await labIntakeRecipients(db),
    subject: `Work requested: ${row.number} from ${row.organisationName} (${lensCount === 1 ? '1 lens' : `${lensCount} lenses`})`,
    text,
    html,
    subjectType: 'work-order',
    subjectId: notice.workOrderId,
  });
}
