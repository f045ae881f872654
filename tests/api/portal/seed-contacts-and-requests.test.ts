import { eq, and } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { organisationContacts, workOrders } from '../../../server/db/schema';
import { DEMO_REQUEST_REFERENCE, demoContacts, seedContactsAndRequests } from '../../../scripts/seed/seed-contacts-and-requests';
import { createTestOrganisation, createTestPerson } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';

let testApp: TestApp;

beforeAll(() => {
  testApp = createTestApp();
});

afterAll(async () => {
  await testApp?.close();
});

describe('seedContactsAndRequests', () => {
  it("adds each client's contacts and one requested work order, and a second run adds nothing", async () => {
    const lab = await createTestOrganisation(testApp.deps, { kind: 'lab' });
    const quillmere = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const tovel = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const buyer = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: quillmere.id });
    const options = {
      organisationIds: { lab: lab.id, quillmere: quillmere.id, tovel: tovel.id },
      requestedById: buyer.id,
      today: '2026-04-01',
      baseUrl: 'http://127.0.0.1:8080',
    };
    const first = await seedContactsAndRequests(testApp.deps.db, options);
    expect(first.contactsAdded).toBe(demoContacts.length);
    expect(first.requestNumber).toMatch(/^WO-2026-\d{4,}$/);
    const second = await seedContactsAndRequests(testApp.deps.db, options);
    expect(second).toEqual({ contactsAdded: 0, requestNumber: null });

    const contacts = await testApp.deps.db.select().from(organisationContacts).where(eq(organisationContacts.organisationId, quillmere.id));
    expect(contacts.map((contact) => contact.email).sort()).toEqual(['purchasing@quillmere.example', 'quality@quillmere.example']);
    const requests = await testApp.deps.db
      .select()
      .from(workOrders)
      .where(and(eq(workOrders.organisationId, quillmere.id), eq(workOrders.clientReference, DEMO_REQUEST_REFERENCE)));
    expect(requests).toHaveLength(1);
    expect(requests[0]).toMatchObject({ status: 'requested', dueDate: '2026-04-29', createdById: buyer.id });
  });
});
