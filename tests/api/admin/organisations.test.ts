import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, createTestPerson, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { auditEventsAbout, send } from './admin-fixtures';

let testApp: TestApp;
let admin: SignedInSession;

beforeAll(async () => {
  testApp = createTestApp();
  const lab = await createTestOrganisation(testApp.deps, { kind: 'lab' });
  admin = await signedInWithRoles(testApp, ['admin'], { organisationId: lab.id });
});

afterAll(async () => {
  await testApp?.close();
});

describe('client organisations', () => {
  it('creates, renames and lists them with contact, people and work-order counts, each change audited', async () => {
    const name = `Halden Optics ${uniqueSuffix()}`;
    const created = await send(admin, 'post', '/api/organisations', { name: `  ${name}  ` });
    expect(created.status).toBe(201);
    const id = created.body.organisation.id;
    expect(created.body.organisation).toMatchObject({ name, kind: 'client', contactCount: 0, personCount: 0, workOrderCount: 0, contacts: [] });

    await createTestPerson(testApp.deps, { roles: ['client'], organisationId: id });
    await send(admin, 'post', `/api/organisations/${id}/contacts`, { name: 'Runa Holt', email: 'runa@halden.example' });
    const listed = await admin.agent.get('/api/organisations?include=counts&kind=client');
    expect(listed.status).toBe(200);
    expect(listed.body.items.find((o: { id: string }) => o.id === id)).toMatchObject({ contactCount: 1, personCount: 1, workOrderCount: 0 });

    const renamed = await send(admin, 'patch', `/api/organisations/${id}`, { name: `${name} AS` });
    expect(renamed.status).toBe(200);
    expect(renamed.body.organisation.name).toBe(`${name} AS`);

    const actions = (await auditEventsAbout(testApp.deps, 'organisation', id)).map((event) => event.action);
    expect(actions).toEqual(['organisation.created', 'organisation.contact-added', 'organisation.renamed']);
  });

  it('refuses a name already taken (any letter case) with 409, and an empty name with 400', async () => {
    const existing = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const dup = await send(admin, 'post', '/api/organisations', { name: existing.name.toUpperCase() });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.name).toBe('This name is already taken.');
    const empty = await send(admin, 'post', '/api/organisations', { name: '   ' });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.name).toBe('Field "name" must not be empty.');
  });

  it('records a postal address (lines trimmed, blank ones dropped), e-mail and phone; fields left out stay; the change is audited with before and after', async () => {
    const created = await send(admin, 'post', '/api/organisations', {
      name: `Orrin Lens Works ${uniqueSuffix()}`,
      postalAddress: '  4 Kiln Street \r\n\r\nMarlow Cross MC2 5OL ',
      email: 'Goods@Orrin.example',
    });
    expect(created.status).toBe(201);
    const { id, name } = created.body.organisation;
    expect(created.body.organisation).toMatchObject({ postalAddress: '4 Kiln Street\nMarlow Cross MC2 5OL', email: 'goods@orrin.example', phone: null });

    const phoned = await send(admin, 'patch', `/api/organisations/${id}`, { name, phone: '+00 555 0160' });
    expect(phoned.status).toBe(200);
    expect(phoned.body.organisation).toMatchObject({ postalAddress: '4 Kiln Street\nMarlow Cross MC2 5OL', email: 'goods@orrin.example', phone: '+00 555 0160' });
    const cleared = await send(admin, 'patch', `/api/organisations/${id}`, { name, email: '', postalAddress: '' });
    expect(cleared.body.organisation).toMatchObject({ postalAddress: '', email: null, phone: '+00 555 0160' });

    const events = await auditEventsAbout(testApp.deps, 'organisation', id);
    const changes = events.filter((event) => event.action === 'organisation.details-changed').map((event) => event.details);
    expect(changes).toEqual([
      { fields: ['phone'], before: { phone: null }, after: { phone: '+00 555 0160' } },
      {
        fields: ['postalAddress', 'email'],
        before: { postalAddress: '4 Kiln Street\nMarlow Cross MC2 5OL', email: 'goods@orrin.example' },
        after: { postalAddress: '', email: null },
      },
    ]);
  });

  it('refuses an address of more than five lines or with a line over 120 characters, and a malformed e-mail, with 400 naming the field, changing nothing', async () => {
    const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const tooMany = await send(admin, 'patch', `/api/organisations/${organisation.id}`, { name: organisation.name, postalAddress: 'a\nb\nc\nd\ne\nf' });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.fields.postalAddress).toBe('Field "postalAddress" must have at most 5 lines.');
    const tooLong = await send(admin, 'patch', `/api/organisations/${organisation.id}`, { name: organisation.name, postalAddress: 'x'.repeat(121) });
    expect(tooLong.body.error.fields.postalAddress).toBe('Each line of field "postalAddress" must be at most 120 characters long.');
    const badEmail = await send(admin, 'patch', `/api/organisations/${organisation.id}`, { name: organisation.name, email: 'not an address' });
    expect(badEmail.status).toBe(400);
    expect(badEmail.body.error.fields.email).toBe('Field "email" must be an e-mail address like name@lab.example.');
    const detail = await admin.agent.get(`/api/organisations/${organisation.id}`);
    expect(detail.body.organisation).toMatchObject({ postalAddress: '', email: null, phone: null });
  });

  it('keeps the plain organisation list unchanged for the bench (no counts unless asked)', async () => {
    const technician = await signedInWithRoles(testApp, ['technician']);
    const response = await technician.agent.get('/api/organisations');
    expect(Object.keys(response.body.items[0]).sort()).toEqual(['id', 'kind', 'name']);
  });
});

describe('organisation contacts', () => {
  it('adds, changes and removes a contact, with audit events naming the contact', async () => {
    const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const added = await send(admin, 'post', `/api/organisations/${organisation.id}/contacts`, {
      name: 'Edda Lund',
      email: 'Edda.Lund@Tovel.example',
      position: 'Quality manager',
      phone: '+47 22 00 00 00',
      receivesCertificates: false,
    });
    expect(added.status).toBe(201);
    const contact = added.body.contact;
    expect(contact).toMatchObject({ email: 'edda.lund@tovel.example', position: 'Quality manager', receivesCertificates: false });

    const changed = await send(admin, 'put', `/api/organisations/${organisation.id}/contacts/${contact.id}`, {
      name: 'Edda Lund',
      email: 'edda.lund@tovel.example',
      position: '',
      phone: null,
      receivesCertificates: true,
    });
    expect(changed.status).toBe(200);
    expect(changed.body.contact).toMatchObject({ position: null, phone: null, receivesCertificates: true });

    const detail = await admin.agent.get(`/api/organisations/${organisation.id}`);
    expect(detail.body.organisation.contacts.map((c: { id: string }) => c.id)).toEqual([contact.id]);

    expect((await send(admin, 'delete', `/api/organisations/${organisation.id}/contacts/${contact.id}`)).status).toBe(204);
    expect((await admin.agent.get(`/api/organisations/${organisation.id}`)).body.organisation.contacts).toEqual([]);

    const events = await auditEventsAbout(testApp.deps, 'organisation', organisation.id);
    expect(events.map((event) => event.action)).toEqual(['organisation.contact-added', 'organisation.contact-changed', 'organisation.contact-removed']);
    expect(events[1].details).toMatchObject({ contactId: contact.id, changed: ['position', 'phone', 'receivesCertificates'] });
  });

  it('rejects a bad address with 400 naming the field and a contact of another organisation with 404', async () => {
    const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const other = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const bad = await send(admin, 'post', `/api/organisations/${organisation.id}/contacts`, { name: 'X', email: 'nope' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.email).toBe('Field "email" must be an e-mail address like name@lab.example.');
    const made = await send(admin, 'post', `/api/organisations/${other.id}/contacts`, { name: 'Y', email: 'y@other.example' });
    const wrongParent = await send(admin, 'delete', `/api/organisations/${organisation.id}/contacts/${made.body.contact.id}`);
    expect(wrongParent.status).toBe(404);
    expect(wrongParent.body.error.message).toBe('This organisation has no contact with this id.');
  });
});
