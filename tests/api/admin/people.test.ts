import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { httpSessions, people } from '../../../server/db/schema';
import { signInAs, signedInWithRoles, startBrowserSession, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, createTestPerson, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { auditEventsAbout, send } from './admin-fixtures';

let testApp: TestApp;
let admin: SignedInSession;
let labId: string;
let clientOrgId: string;

beforeAll(async () => {
  testApp = createTestApp();
  labId = (await createTestOrganisation(testApp.deps, { kind: 'lab' })).id;
  clientOrgId = (await createTestOrganisation(testApp.deps, { kind: 'client' })).id;
  admin = await signedInWithRoles(testApp, ['admin'], { organisationId: labId });
});

afterAll(async () => {
  await testApp?.close();
});

describe('admin routes refuse other roles', () => {
  const adminRoutes: [method: 'get' | 'post' | 'put' | 'patch' | 'delete', path: string][] = [
    ['get', '/api/people'],
    ['put', '/api/people/00000000-0000-4000-8000-000000000000/roles'],
    ['post', '/api/people/00000000-0000-4000-8000-000000000000/deactivate'],
    ['post', '/api/people/00000000-0000-4000-8000-000000000000/reactivate'],
    ['post', '/api/people/00000000-0000-4000-8000-000000000000/password-reset'],
    ['get', '/api/invitations'],
    ['post', '/api/invitations'],
    ['post', '/api/invitations/00000000-0000-4000-8000-000000000000/revoke'],
    ['post', '/api/invitations/00000000-0000-4000-8000-000000000000/resend'],
    ['post', '/api/organisations'],
    ['get', '/api/organisations/00000000-0000-4000-8000-000000000000'],
    ['patch', '/api/organisations/00000000-0000-4000-8000-000000000000'],
    ['post', '/api/organisations/00000000-0000-4000-8000-000000000000/contacts'],
    ['put', '/api/organisations/00000000-0000-4000-8000-000000000000/contacts/00000000-0000-4000-8000-000000000000'],
    ['delete', '/api/organisations/00000000-0000-4000-8000-000000000000/contacts/00000000-0000-4000-8000-000000000000'],
    ['get', '/api/audit-events'],
    ['get', '/api/audit-events/export'],
    ['get', '/api/outbound-mail'],
    ['get', '/api/outbound-mail/00000000-0000-4000-8000-000000000000'],
    ['post', '/api/outbound-mail/00000000-0000-4000-8000-000000000000/retry'],
  ];

  it('answers technician, reviewer and client with 403 and an anonymous visitor with 401 on every admin route', async () => {
    const others = [
      await signedInWithRoles(testApp, ['technician'], { organisationId: labId }),
      await signedInWithRoles(testApp, ['reviewer'], { organisationId: labId }),
      await signedInWithRoles(testApp, ['client'], { organisationId: clientOrgId }),
    ];
    for (const [method, path] of adminRoutes) {
      for (const session of others) {
        const response = method === 'get' ? await session.agent.get(path) : await send(session, method, path);
        expect(response.status, `${method} ${path} as ${session.person.roles[0]}`).toBe(403);
      }
      const anonymous = await startBrowserSession(testApp.app);
      const answer = method === 'get' ? await anonymous.agent.get(path) : await send(anonymous, method, path);
      expect(answer.status, `${method} ${path} anonymous`).toBe(401);
    }
  });
});

describe('GET /api/people', () => {
  it('searches name and e-mail, filters by role and active, and pages', async () => {
    const tag = uniqueSuffix();
    const made = [];
    for (let i = 0; i < 3; i += 1) {
      made.push(await createTestPerson(testApp.deps, { roles: ['technician'], name: `Searchable ${tag} ${i}`, organisationId: labId }));
    }
    const reviewer = await createTestPerson(testApp.deps, { roles: ['reviewer'], name: `Searchable ${tag} r`, organisationId: labId, active: false });

    const byName = await admin.agent.get(`/api/people?q=${tag}`);
    expect(byName.status).toBe(200);
    expect(byName.body.total).toBe(4);
    expect(byName.body.people.map((p: { id: string }) => p.id).sort()).toEqual([...made.map((p) => p.id), reviewer.id].sort());

    const byEmail = await admin.agent.get(`/api/people?q=${encodeURIComponent(made[1].email.toUpperCase())}`);
    expect(byEmail.body.people.map((p: { id: string }) => p.id)).toEqual([made[1].id]);

    const reviewersOnly = await admin.agent.get(`/api/people?q=${tag}&role=reviewer`);
    expect(reviewersOnly.body.people.map((p: { id: string }) => p.id)).toEqual([reviewer.id]);

    const activeOnly = await admin.agent.get(`/api/people?q=${tag}&active=true`);
    expect(activeOnly.body.total).toBe(3);

    const page2 = await admin.agent.get(`/api/people?q=${tag}&pageSize=3&page=2`);
    expect(page2.body).toMatchObject({ total: 4, page: 2, pageSize: 3 });
    expect(page2.body.people.map((p: { id: string }) => p.id)).toEqual([reviewer.id]);

    const bad = await admin.agent.get('/api/people?role=wizard');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.role).toBe('Field "role" must be technician, reviewer, client or admin.');
  });

  it('treats % and _ in the search as plain characters', async () => {
    const response = await admin.agent.get('/api/people?q=%25');
    expect(response.status).toBe(200);
    expect(response.body.people.every((p: { name: string; email: string }) => `${p.name}${p.email}`.includes('%'))).toBe(true);
  });

  it('records the time of the last sign-in', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    const before = await admin.agent.get(`/api/people?q=${person.email}`);
    expect(before.body.people[0].lastSignInAt).toBeNull();
    await signInAs(testApp.app, person);
    const after = await admin.agent.get(`/api/people?q=${person.email}`);
    expect(after.body.people[0].lastSignInAt).toEqual(expect.any(String));
  });
});

describe('PUT /api/people/:personId/roles', () => {
  it('replaces the roles and records before and after in the audit log', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    const response = await send(admin, 'put', `/api/people/${person.id}/roles`, { roles: ['reviewer', 'technician'] });
    expect(response.status).toBe(200);
    expect(response.body.person.roles).toEqual(['technician', 'reviewer']);

    const events = await auditEventsAbout(testApp.deps, 'person', person.id);
    const changed = events.find((event) => event.action === 'person.roles-changed');
    expect(changed).toMatchObject({ actorId: admin.person.id, details: { before: ['technician'], after: ['reviewer', 'technician'] } });
  });

  it('takes effect on a session that is already open', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician', 'admin'], organisationId: labId });
    const theirSession = await signInAs(testApp.app, person);
    expect((await theirSession.agent.get('/api/people')).status).toBe(200);
    expect((await send(admin, 'put', `/api/people/${person.id}/roles`, { roles: ['technician'] })).status).toBe(200);
    expect((await theirSession.agent.get('/api/people')).status).toBe(403);
  });

  it('refuses the client role for lab staff and lab roles for client people, with a sentence', async () => {
    const staff = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    const toClient = await send(admin, 'put', `/api/people/${staff.id}/roles`, { roles: ['client'] });
    expect(toClient.status).toBe(409);
    expect(toClient.body.error.message).toBe('Only a person of a client organisation can hold the client role.');

    const buyer = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: clientOrgId });
    const toReviewer = await send(admin, 'put', `/api/people/${buyer.id}/roles`, { roles: ['client', 'reviewer'] });
    expect(toReviewer.status).toBe(409);
    expect(toReviewer.body.error.message).toBe('The client role cannot be combined with technician, reviewer or admin.');
  });

  it('rejects an empty or unknown role list with 400 naming the field, and an unknown person with 404', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    const empty = await send(admin, 'put', `/api/people/${person.id}/roles`, { roles: [] });
    expect(empty.status).toBe(400);
    expect(empty.body.error.fields.roles).toBe('Field "roles" must name at least one role.');
    const unknownRole = await send(admin, 'put', `/api/people/${person.id}/roles`, { roles: ['wizard'] });
    expect(unknownRole.status).toBe(400);
    const missing = await send(admin, 'put', '/api/people/00000000-0000-4000-8000-000000000000/roles', { roles: ['technician'] });
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toBe('There is no person with this id.');
  });
});

describe('deactivating and reactivating a person', () => {
  it('ends a live session at once: the next request of that browser gets 401', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    const theirSession = await signInAs(testApp.app, person);
    expect((await theirSession.agent.get('/api/auth/me')).status).toBe(200);

    const response = await send(admin, 'post', `/api/people/${person.id}/deactivate`);
    expect(response.status).toBe(200);
    expect(response.body.person).toMatchObject({ active: false, deactivatedAt: expect.any(String) });

    const stored = await testApp.deps.db.select().from(httpSessions).where(sql`(${httpSessions.sess}->>'personId') = ${person.id}`);
    expect(stored).toHaveLength(0);
    expect((await theirSession.agent.get('/api/auth/me')).status).toBe(401);

    const signInAgain = await send(theirSession, 'post', '/api/auth/sign-in', { email: person.email, password: person.password });
    expect(signInAgain.status).toBe(401);

    const events = await auditEventsAbout(testApp.deps, 'person', person.id);
    expect(events.find((event) => event.action === 'person.deactivated')).toMatchObject({ actorId: admin.person.id, details: { sessionsEnded: 1 } });
  });

  it('refuses a session whose person was made inactive behind the API’s back', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['reviewer'], organisationId: labId });
    const theirSession = await signInAs(testApp.app, person);
    await testApp.deps.db.update(people).set({ active: false }).where(eq(people.id, person.id));
    expect((await theirSession.agent.get('/api/auth/me')).status).toBe(401);
  });

  it('lets a reactivated person sign in again and audits it', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    await send(admin, 'post', `/api/people/${person.id}/deactivate`);
    const response = await send(admin, 'post', `/api/people/${person.id}/reactivate`);
    expect(response.status).toBe(200);
    expect(response.body.person).toMatchObject({ active: true, deactivatedAt: null });
    await signInAs(testApp.app, person);
    const events = await auditEventsAbout(testApp.deps, 'person', person.id);
    expect(events.map((event) => event.action)).toEqual(expect.arrayContaining(['person.deactivated', 'person.reactivated', 'auth.sign-in']));
  });
});
