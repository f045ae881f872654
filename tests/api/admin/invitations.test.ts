import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invitations, people } from '../../../server/db/schema';
import { signedInWithRoles, startBrowserSession, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, createTestPerson, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { auditEventsAbout, latestOutboxMessage, send, tokenInLink } from './admin-fixtures';

let testApp: TestApp;
let admin: SignedInSession;
let lab: { id: string; name: string };
let clientOrg: { id: string; name: string };

beforeAll(async () => {
  testApp = createTestApp({ env: { PUBLIC_BASE_URL: 'https://paraxia.lab.example' } });
  lab = await createTestOrganisation(testApp.deps, { kind: 'lab' });
  clientOrg = await createTestOrganisation(testApp.deps, { kind: 'client' });
  admin = await signedInWithRoles(testApp, ['admin'], { organisationId: lab.id });
});

afterAll(async () => {
  await testApp?.close();
});

function newAddress(prefix = 'invitee'): string {
  return `${prefix}-${uniqueSuffix()}@test.example`;
}

async function invite(body: Record<string, unknown>) {
  const response = await send(admin, 'post', '/api/invitations', body);
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  const message = await latestOutboxMessage(testApp.deps, 'invitation', String(body.email).toLowerCase());
  expect(message).not.toBeNull();
  return { invitation: response.body.invitation, message: message!, token: tokenInLink(message!, 'invitation') };
}

describe('inviting a person', () => {
  it('queues a mail whose link, under PUBLIC_BASE_URL, opens a page naming the invitee', async () => {
    const email = newAddress();
    const { invitation, message, token } = await invite({ email: email.toUpperCase(), name: 'Ilse Varga', roles: ['technician'] });
    expect(invitation).toMatchObject({ email, name: 'Ilse Varga', roles: ['technician'], state: 'pending' });
    expect(message.status).toBe('queued');
    expect(message.textBody).toContain(`https://paraxia.lab.example/invitation/${token}`);
    expect(message.htmlBody).toContain(`https://paraxia.lab.example/invitation/${token}`);
    // Only the token's SHA-256 is stored.
    const [row] = await testApp.deps.db.select().from(invitations).where(eq(invitations.id, invitation.id));
    expect(row.tokenHash).not.toContain(token);
    expect(row.tokenHash).toMatch(/^[0-9a-f]{64}$/);
    // 7 days, give or take the test's own run time.
    const days = (row.expiresAt.getTime() - row.createdAt.getTime()) / 86_400_000;
    expect(days).toBeCloseTo(7, 2);

    const visitor = await startBrowserSession(testApp.app);
    const view = await visitor.agent.get(`/api/invitation-links/${token}`);
    expect(view.status).toBe(200);
    expect(view.body.invitation).toMatchObject({ name: 'Ilse Varga', email, roles: ['technician'] });
    expect(view.body.invitation.labName).toEqual(expect.any(String));

    const events = await auditEventsAbout(testApp.deps, 'invitation', invitation.id);
    expect(events[0]).toMatchObject({ action: 'invitation.sent', actorId: admin.person.id });
  });

  it('accepting creates the person with the roles and organisation, signs them in, and works only once', async () => {
    const email = newAddress('client');
    const { invitation, token } = await invite({ email, name: 'Brede Olsen', roles: ['client'], organisationId: clientOrg.id });
    const visitor = await startBrowserSession(testApp.app);
    const accepted = await send(visitor, 'post', `/api/invitation-links/${token}`, { password: 'a long enough passphrase' });
    expect(accepted.status).toBe(201);
    expect(accepted.body.user).toMatchObject({ email, name: 'Brede Olsen', roles: ['client'], organisation: { id: clientOrg.id } });
    const me = await visitor.agent.get('/api/auth/me');
    expect(me.body.user.email).toBe(email);

    const again = await send(await startBrowserSession(testApp.app), 'post', `/api/invitation-links/${token}`, { password: 'another long passphrase' });
    expect(again.status).toBe(410);
    expect(again.body.error.message).toBe('This invitation has already been accepted; sign in with the password you chose.');
    expect((await visitor.agent.get(`/api/invitation-links/${token}`)).status).toBe(410);

    const signIn = await send(await startBrowserSession(testApp.app), 'post', '/api/auth/sign-in', { email, password: 'a long enough passphrase' });
    expect(signIn.status).toBe(200);

    const events = await auditEventsAbout(testApp.deps, 'invitation', invitation.id);
    const acceptedEvent = events.find((event) => event.action === 'invitation.accepted');
    expect(acceptedEvent?.actorId).toBe(accepted.body.user.id);
  });

  it('answers an expired link with 410 and creates nobody', async () => {
    const email = newAddress();
    const { invitation, token } = await invite({ email, name: 'Late Comer', roles: ['reviewer'] });
    await testApp.deps.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.id, invitation.id));
    const visitor = await startBrowserSession(testApp.app);
    const view = await visitor.agent.get(`/api/invitation-links/${token}`);
    expect(view.status).toBe(410);
    expect(view.body.error.message).toBe('This invitation has expired; ask the lab to send you a new one.');
    const accept = await send(visitor, 'post', `/api/invitation-links/${token}`, { password: 'a long enough passphrase' });
    expect(accept.status).toBe(410);
    expect(await testApp.deps.db.select().from(people).where(eq(people.email, email))).toHaveLength(0);

    const listed = await admin.agent.get('/api/invitations?state=expired');
    expect(listed.body.items.map((item: { id: string }) => item.id)).toContain(invitation.id);
  });

  it('honours INVITATION_EXPIRY_HOURS', async () => {
    const shortLived = createTestApp({ env: { INVITATION_EXPIRY_HOURS: '2' } });
    try {
      const shortAdmin = await signedInWithRoles(shortLived, ['admin'], { organisationId: lab.id });
      const response = await send(shortAdmin, 'post', '/api/invitations', { email: newAddress(), name: 'Two Hours', roles: ['technician'] });
      const [row] = await shortLived.deps.db.select().from(invitations).where(eq(invitations.id, response.body.invitation.id));
      expect((row.expiresAt.getTime() - row.createdAt.getTime()) / 3_600_000).toBeCloseTo(2, 2);
    } finally {
      await shortLived.close();
    }
  });

  it('refuses a weak password with 400 naming the field, and a made-up link with 404', async () => {
    const { token } = await invite({ email: newAddress(), name: 'Short Word', roles: ['technician'] });
    const visitor = await startBrowserSession(testApp.app);
    const weak = await send(visitor, 'post', `/api/invitation-links/${token}`, { password: 'short' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.fields.password).toBe('Field "password" must be at least 12 characters long.');
    const madeUp = await visitor.agent.get(`/api/invitation-links/${'x'.repeat(43)}`);
    expect(madeUp.status).toBe(404);
    expect(madeUp.body.error.message).toMatch(/^This invitation link is not valid/);
  });

  it('a withdrawn invitation’s link answers 410; a resent one gets a new link and the old one stops working', async () => {
    const email = newAddress();
    const first = await invite({ email, name: 'Twice Sent', roles: ['technician'] });
    const resent = await send(admin, 'post', `/api/invitations/${first.invitation.id}/resend`);
    expect(resent.status).toBe(200);
    const newToken = tokenInLink((await latestOutboxMessage(testApp.deps, 'invitation', email))!, 'invitation');
    expect(newToken).not.toBe(first.token);
    const visitor = await startBrowserSession(testApp.app);
    expect((await visitor.agent.get(`/api/invitation-links/${first.token}`)).status).toBe(404);
    expect((await visitor.agent.get(`/api/invitation-links/${newToken}`)).status).toBe(200);

    const revoked = await send(admin, 'post', `/api/invitations/${first.invitation.id}/revoke`);
    expect(revoked.status).toBe(200);
    expect(revoked.body.invitation.state).toBe('revoked');
    const view = await visitor.agent.get(`/api/invitation-links/${newToken}`);
    expect(view.status).toBe(410);
    expect(view.body.error.message).toBe('This invitation was withdrawn by the lab; ask them if you still need an account.');

    const actions = (await auditEventsAbout(testApp.deps, 'invitation', first.invitation.id)).map((event) => event.action);
    expect(actions).toEqual(['invitation.sent', 'invitation.resent', 'invitation.revoked']);
  });

  it('refuses an address that already has an account or a pending invitation (409), and a client without a client organisation (400)', async () => {
    const existing = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: lab.id });
    const taken = await send(admin, 'post', '/api/invitations', { email: existing.email, name: 'Dup', roles: ['technician'] });
    expect(taken.status).toBe(409);
    expect(taken.body.error.fields.email).toBe('This address already has an account.');

    const email = newAddress();
    await invite({ email, name: 'Pending', roles: ['technician'] });
    const pending = await send(admin, 'post', '/api/invitations', { email, name: 'Pending again', roles: ['technician'] });
    expect(pending.status).toBe(409);

    const noOrg = await send(admin, 'post', '/api/invitations', { email: newAddress(), name: 'Orphan', roles: ['client'] });
    expect(noOrg.status).toBe(400);
    expect(noOrg.body.error.message).toBe('Only a person of a client organisation can hold the client role.');

    const badEmail = await send(admin, 'post', '/api/invitations', { email: 'not-an-address', name: 'X', roles: ['technician'] });
    expect(badEmail.status).toBe(400);
    expect(badEmail.body.error.fields.email).toBe('Field "email" must be an e-mail address like name@lab.example.');
  });
});
