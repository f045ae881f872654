/**
 * Demo contacts for the two invented clients, and one request for new work
 * from Quillmere Instruments waiting for the lab (status "requested").
 * Idempotent: a contact is found again by organisation and e-mail, the
 * request by organisation and client reference. The request goes through the
 * same service as the portal, so it has its number, audit event and the
 * lab's e-mail in the outbox.
 */
import { and, eq } from 'drizzle-orm';
import type { Database } from '../../server/db/client';
import { organisationContacts, workOrders } from '../../server/db/schema';
import { createWorkRequest } from '../../server/services/portal/create-work-request';
import type { DemoOrganisationKey } from './demo-organisations';

type ClientKey = Exclude<DemoOrganisationKey, 'lab'>;

/** Invented people at the invented clients (".example" addresses). */
export const demoContacts: readonly { organisation: ClientKey; name: string; email: string; position: string; phone: string | null; receivesCertificates: boolean }[] = [
  { organisation: 'quillmere', name: 'Rosalind Achterberg', email: 'quality@quillmere.example', position: 'Quality manager', phone: '+00 555 0171', receivesCertificates: true },
  { organisation: 'quillmere', name: 'Bartholomew Okonkwo-Reyes', email: 'purchasing@quillmere.example', position: 'Purchasing', phone: null, receivesCertificates: false },
  { organisation: 'tovel', name: 'Sigrun Valtonen', email: 'inspection@tovel-marine.example', position: 'Incoming inspection lead', phone: '+00 555 0188', receivesCertificates: true },
];

export const DEMO_REQUEST_REFERENCE = 'QI-PO-2291';

export interface SeedContactsAndRequestsOptions {
  organisationIds: Record<DemoOrganisationKey, string>;
  /** The client person who sends the request (the Quillmere demo buyer). */
  requestedById: string;
  /** Seeding day, YYYY-MM-DD; the requested due date counts from it. */
  today: string;
  /** PUBLIC_BASE_URL, for the link in the lab's e-mail. */
  baseUrl: string;
}

function addDays(isoDate: string, days: number): string {
  const date = new Date(`${isoDate}T00:00:00Z`);
  date.setUTCDate(date.getUTCDate() + days);
  return date.toISOString().slice(0, 10);
}

export async function seedContactsAndRequests(db: Database, options: SeedContactsAndRequestsOptions): Promise<{ contactsAdded: number; requestNumber: string | null }> {
  let contactsAdded = 0;
  for (const contact of demoContacts) {
    const organisationId = options.organisationIds[contact.organisation];
    const [existing] = await db
      .select({ id: organisationContacts.id })
      .from(organisationContacts)
      .where(and(eq(organisationContacts.organisationId, organisationId), eq(organisationContacts.email, contact.email)));
    if (existing) continue;
    await db.insert(organisationContacts).values({
      organisationId,
      name: contact.name,
      email: contact.email,
      position: contact.position,
      phone: contact.phone,
      receivesCertificates: contact.receivesCertificates,
    });
    contactsAdded += 1;
  }

  const quillmereId = options.organisationIds.quillmere;
  const [request] = await db
    .select({ id: workOrders.id })
    .from(workOrders)
    .where(and(eq(workOrders.organisationId, quillmereId), eq(workOrders.clientReference, DEMO_REQUEST_REFERENCE)));
  if (request) return { contactsAdded, requestNumber: null };
  const created = await createWorkRequest(
    db,
    {
      title: 'Eyepiece field lenses for the QI-7 spotting scope',
      clientReference: DEMO_REQUEST_REFERENCE,
      dueDate: addDays(options.today, 28),
      notes: 'Three field lenses from the new supplier; please state the back focal distance where the method gives it.',
      decisionRule: 'guarded',
      lenses: [
        { identifier: 'QI7-FL-001', description: 'Plano-convex field lens, 18 mm diameter', partNumber: 'QI7-FL', nominalFocalLengthMm: 38, tolerancePercent: 2 },
        { identifier: 'QI7-FL-002', description: 'Plano-convex field lens, 18 mm diameter', partNumber: 'QI7-FL', nominalFocalLengthMm: 38, tolerancePercent: 2 },
        { identifier: 'QI7-FL-003', description: 'Plano-convex field lens, 18 mm diameter', partNumber: 'QI7-FL', nominalFocalLengthMm: 38, tolerancePercent: 2 },
      ],
    },
    { actor: { actorId: options.requestedById, ip: null }, organisationId: quillmereId, baseUrl: options.baseUrl, todayIsoDate: options.today },
  );
  return { contactsAdded, requestNumber: created.workOrder.number };
}
