import { and, eq } from 'drizzle-orm';
import type { CertificateData } from '../../certificates/certificate-data';
import { certificates, organisationContacts, organisations, people, personRoles, workOrders, lenses, measurements } from '../../db/schema';
import { invariant } from '../../invariant';
import type { Queryable } from '../numbering';
import { queueMail } from '../outbound-mail/queue-mail';
import { linkUnder, renderMail } from './mail-layout';

export interface CertificateIssuedNotice {
  certificateId: string;
  /** PUBLIC_BASE_URL, for links in the message. */
  baseUrl: string;
}

/** The addresses told of a new certificate: the organisation's contacts who receive certificates, and its active client accounts. */
export async function certificateRecipients(db: Queryable, organisationId: string): Promise<string[]> {
  const contacts = await db
    .select({ email: organisationContacts.email })
    .from(organisationContacts)
    .where(and(eq(organisationContacts.organisationId, organisationId), eq(organisationContacts.receivesCertificates, true)));
  const clientPeople = await db
    .select({ email: people.email })
    .from(people)
    .innerJoin(personRoles, and(eq(personRoles.personId, people.id), eq(personRoles.role, 'client')))
    .where(and(eq(people.organisationId, organisationId), eq(people.active, true)));
  return [...contacts, ...clientPeople].map((row) => row.email);
}

/** Queues "certificate issued" to the client organisation's contacts (inside the issuing transaction). */
export async function notifyCertificateIssued(db: Queryable, notice: CertificateIssuedNotice): Promise<void> {
  const [row] = await db
    .select({
      number: certificates.number,
      revision: certificates.revision,
      verificationCode: certificates.verificationCode,
      data: certificates.data,
      organisationId: certificates.organisationId,
      organisationName: organisations.name,
      workOrderNumber: workOrders.number,
      clientReference: workOrders.clientReference,
      lensIdentifier: lenses.identifier,
      lensDescription: lenses.description,
    })
    .from(certificates)
    .innerJoin(organisations, eq(organisations.id, certificates.organisationId))
    .innerJoin(measurements, eq(measurements.id, certificates.measurementId))
    .innerJoin(lenses, eq(lenses.id, measurements.lensId))
    .innerJoin(workOrders, eq(workOrders.id, lenses.workOrderId))
    .where(eq(certificates.id, notice.certificateId));
  invariant(row, `certificate ${notice.certificateId} does not exist`);
  const data = row.data as unknown as CertificateData;
  const labName = data.lab?.name ?? 'The laboratory';
  const reference = `${row.number} revision ${row.revision}`;
  const lens = row.lensDescription ? `${row.lensIdentifier} (${row.lensDescription})` : row.lensIdentifier;

  const paragraphs = [
    `${labName} has issued certificate ${reference} for lens ${lens}, measured for ${row.organisationName}.`,
    row.revision > 1
      ? `This revision replaces revision ${row.revision - 1}${data.certificate?.replaces?.reason ? `: ${data.certificate.replaces.reason}` : ''}. The earlier revision is kept and marked as superseded.`
      : 'Sign in to the portal to download the PDF. Anyone holding the certificate can check that it is genuine with its verification code.',
  ];
  const facts = [
    { label: 'Certificate', value: reference },
    { label: 'Lens', value: row.lensIdentifier },
    { label: 'Work order', value: row.clientReference ? `${row.workOrderNumber} (your reference ${row.clientReference})` : row.workOrderNumber },
    { label: 'Verification code', value: row.verificationCode },
  ];
  const { text, html } = renderMail({
    heading: `Certificate ${row.number} issued`,
    paragraphs,
    facts,
    links: [
      { label: 'Your orders and certificates', url: linkUnder(notice.baseUrl, '/orders') },
      { label: 'Verify this certificate', url: linkUnder(notice.baseUrl, `/verify/${row.verificationCode}`) },
    ],
    footnote: `Sent by Paraxia for ${labName}. Conformity decisions and any accreditation claims remain the laboratory's responsibility.`,
  });
  await queueMail(db, {
    kind: 'certificate-issued',
    to: await certificateRecipients(db, row.organisationId),
    subject: `Certificate ${row.number} rev. ${row.revision} issued for lens ${row.lensIdentifier}`,
    text,
    html,
    subjectType: 'certificate',
    subjectId: notice.certificateId,
  });
}
