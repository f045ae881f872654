import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, outboundMail, passwordResets } from '../../../server/db/schema';
import { dispatchDueMail } from '../../../server/services/outbound-mail/dispatch-due-mail';
import { readMailIndex } from '../../../server/services/mail-store';
import { signInAs, signedInWithRoles, startBrowserSession, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, createTestPerson, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { auditEventsAbout, latestOutboxMessage, send, tokenInLink } from './admin-fixtures';

let testApp: TestApp;
let admin: SignedInSession;
let labId: string;

beforeAll(async () => {
  testApp = createTestApp({ env: { PASSWORD_RESET_RATE_LIMIT_MAX: '3' } });
  labId = (await createTestOrganisation(testApp.deps, { kind: 'lab' })).id;
  admin = await signedInWithRoles(testApp, ['admin'], { organisationId: labId });
});

afterAll(async () => {
  await testApp?.close();
});

describe('"forgot your password?"', () => {
  it('answers 202 with the same body for a known and an unknown address, and queues mail only for the known one', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    const unknown = `nobody-${uniqueSuffix()}@test.example`;
    const visitor = await startBrowserSession(testApp.app);
    const known = await send(visitor, 'post', '/api/password-reset-requests', { email: person.email });
    const notKnown = await send(visitor, 'post', '/api/password-reset-requests', { email: unknown });
    expect(known.status).toBe(202);
    expect(notKnown.status).toBe(202);
    expect(notKnown.body).toEqual(known.body);
    expect(await latestOutboxMessage(testApp.deps, 'password-reset', person.email)).not.toBeNull();
    expect(await latestOutboxMessage(testApp.deps, 'password-reset', unknown)).toBeNull();

    const refused = await testApp.deps.db.select().from(auditEvents).where(eq(auditEvents.action, 'password-reset.refused'));
    expect(refused.some((event) => event.details.email === unknown)).toBe(true);
  });

  it('sends nothing to a deactivated account, still answering 202', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId, active: false });
    const visitor = await startBrowserSession(testApp.app);
    expect((await send(visitor, 'post', '/api/password-reset-requests', { email: person.email })).status).toBe(202);
    expect(await latestOutboxMessage(testApp.deps, 'password-reset', person.email)).toBeNull();
  });

  it('is rate-limited per address whether or not it has an account', async () => {
    const visitor = await startBrowserSession(testApp.app);
    const unknown = `flood-${uniqueSuffix()}@test.example`;
    const statuses = [];
    for (let i = 0; i < 4; i += 1) statuses.push((await send(visitor, 'post', '/api/password-reset-requests', { email: unknown })).status);
    expect(statuses).toEqual([202, 202, 202, 429]);
  });
});

describe('choosing a new password from a link', () => {
  it('sets the password, ends the person’s other sessions, signs this browser in, and works once', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['reviewer'], organisationId: labId });
    const otherBrowser = await signInAs(testApp.app, person);
    const response = await send(admin, 'post', `/api/people/${person.id}/password-reset`);
    expect(response.status).toBe(202);
    const message = (await latestOutboxMessage(testApp.deps, 'password-reset', person.email))!;
    expect(message.textBody).toContain('An administrator');
    const token = tokenInLink(message, 'password-reset');

    const visitor = await startBrowserSession(testApp.app);
    const view = await visitor.agent.get(`/api/password-reset-links/${token}`);
    expect(view.status).toBe(200);
    expect(view.body.passwordReset).toMatchObject({ email: person.email, name: person.name });

    const done = await send(visitor, 'post', `/api/password-reset-links/${token}`, { password: 'my new bench passphrase' });
    expect(done.status).toBe(200);
    expect(done.body.user.id).toBe(person.id);
    expect((await visitor.agent.get('/api/auth/me')).status).toBe(200);
    expect((await otherBrowser.agent.get('/api/auth/me')).status).toBe(401);

    const oldPassword = await send(await startBrowserSession(testApp.app), 'post', '/api/auth/sign-in', { email: person.email, password: person.password });
    expect(oldPassword.status).toBe(401);
    await signInAs(testApp.app, { ...person, password: 'my new bench passphrase' });

    const again = await send(await startBrowserSession(testApp.app), 'post', `/api/password-reset-links/${token}`, { password: 'yet another passphrase' });
    expect(again.status).toBe(410);
    expect(again.body.error.message).toMatch(/already been used/);

    const actions = (await auditEventsAbout(testApp.deps, 'person', person.id)).map((event) => [event.action, event.actorId]);
    expect(actions).toEqual(
      expect.arrayContaining([
        ['password-reset.requested', admin.person.id],
        ['password-reset.completed', person.id],
      ]),
    );
  });

  it('answers an expired link with 410 and leaves the password as it was', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    await send(admin, 'post', `/api/people/${person.id}/password-reset`);
    const token = tokenInLink((await latestOutboxMessage(testApp.deps, 'password-reset', person.email))!, 'password-reset');
    await testApp.deps.db.update(passwordResets).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(passwordResets.personId, person.id));
    const visitor = await startBrowserSession(testApp.app);
    const done = await send(visitor, 'post', `/api/password-reset-links/${token}`, { password: 'too late passphrase' });
    expect(done.status).toBe(410);
    expect(done.body.error.message).toBe('This password link has expired; ask for a new one from the sign-in page.');
    await signInAs(testApp.app, person);
  });

  it('expires an hour after it was asked for by default', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    await send(admin, 'post', `/api/people/${person.id}/password-reset`);
    const [row] = await testApp.deps.db.select().from(passwordResets).where(eq(passwordResets.personId, person.id));
    expect((row.expiresAt.getTime() - row.createdAt.getTime()) / 60_000).toBeCloseTo(60, 1);
  });

  it('reaches the fake SMTP server through the dispatcher', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId });
    await send(admin, 'post', `/api/people/${person.id}/password-reset`);
    const message = (await latestOutboxMessage(testApp.deps, 'password-reset', person.email))!;
    const result = await dispatchDueMail(testApp.deps, { mailIds: [message.id] });
    expect(result.sent).toBe(1);
    const [row] = await testApp.deps.db.select().from(outboundMail).where(eq(outboundMail.id, message.id));
    expect(row.status).toBe('sent');
    const delivered = (await readMailIndex(testApp.deps.env.MAIL_STORE_DIR)).find((entry) => entry.envelopeTo.includes(person.email));
    expect(delivered?.subject).toBe(message.subject);
    expect(delivered?.textPreview).toContain('Choose a new password');
  });

  it('refuses an admin reset for a deactivated person with 409', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'], organisationId: labId, active: false });
    const response = await send(admin, 'post', `/api/people/${person.id}/password-reset`);
    expect(response.status).toBe(409);
    expect(response.body.error.message).toBe('This account is deactivated; reactivate it before sending a password link.');
  });
});
