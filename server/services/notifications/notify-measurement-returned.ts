import { eq } from 'drizzle-orm';
import { lenses, measurements, people, workOrders } from '../../db/schema';
import { invariant } from '../../invariant';
import type { Queryable } from '../numbering';
import { queueMail } from '../outbound-mail/queue-mail';
import { linkUnder, renderMail } from './mail-layout';

export interface MeasurementReturnedNotice {
  measurementId: string;
  /** The reviewer's comment that came with the return. */
  comment: string;
  returnedById: string;
  baseUrl: string;
}

/** Queues "measurement returned" to the technician who performed it (inside the returning transaction). */
export async function notifyMeasurementReturned(db: Queryable, notice: MeasurementReturnedNotice): Promise<void> {
  const [row] = await db
    .select({
      number: measurements.number,
      performedById: measurements.performedById,
      lensIdentifier: lenses.identifier,
      workOrderNumber: workOrders.number,
    })
    .from(measurements)
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(eq(measurements.id, notice.measurementId));
  invariant(row, `measurement ${notice.measurementId} does not exist`);
  if (!row.performedById) return;
  const [technician] = await db.select({ email: people.email, name: people.name, active: people.active }).from(people).where(eq(people.id, row.performedById));
  const [reviewer] = await db.select({ name: people.name }).from(people).where(eq(people.id, notice.returnedById));
  if (!technician || !technician.active) return;
  const reviewerName = reviewer?.name ?? 'The reviewer';

  const { text, html } = renderMail({
    heading: `Measurement ${row.number} was returned`,
    paragraphs: [
      `${technician.name}, ${reviewerName} returned measurement ${row.number} of lens ${row.lensIdentifier} (work order ${row.workOrderNumber}) for changes.`,
      'It is back in draft: address the comment, re-run the analysis if needed and submit it again.',
    ],
    quote: { attribution: `${reviewerName} wrote`, text: notice.comment },
    links: [{ label: `Open measurement ${row.number}`, url: linkUnder(notice.baseUrl, `/measurements/${notice.measurementId}`) }],
    footnote: 'Sent by Paraxia because you performed this measurement.',
  });
  await queueMail(db, {
    kind: 'measurement-returned',
    to: [technician.email],
    subject: `Measurement ${row.number} (lens ${row.lensIdentifier}) returned by ${reviewerName}`,
    text,
    html,
    subjectType: 'measurement',
    subjectId: notice.measurementId,
  });
}
