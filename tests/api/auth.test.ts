import { and, desc, eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents } from '../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { SESSION_COOKIE_NAME } from '../../server/middleware/session';
import { cookieFromResponse, signInAs, startBrowserSession } from '../helpers/browser-session';
import { createTestOrganisation, createTestPerson, setPersonActive, uniqueSuffix } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';

const FAILED = 'That e-mail and password do not match an active account.';

let testApp: TestApp;

beforeAll(() => {
  testApp = createTestApp();
});

afterAll(async () => {
  await testApp?.close();
});

async function lastAuditEvent(action: string, subjectId?: string) {
  const [event] = await testApp.deps.db
    .select()
    .from(auditEvents)
    .where(subjectId ? and(eq(auditEvents.action, action), eq(auditEvents.subjectId, subjectId)) : eq(auditEvents.action, action))
    .orderBy(desc(auditEvents.id))
    .limit(1);
  return event;
}

describe('POST /api/auth/sign-in', () => {
  it('signs in with the right password and returns the user with roles and organisation', async () => {
    const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
    const person = await createTestPerson(testApp.deps, { roles: ['client'], organisationId: organisation.id });
    const browser = await startBrowserSession(testApp.app);

    const response = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .send({ email: person.email, password: person.password });

    expect(response.status).toBe(200);
    expect(response.body).toEqual({
      user: {
        id: person.id,
        email: person.email,
        name: person.name,
        roles: ['client'],
        organisation: { id: organisation.id, name: organisation.name, kind: 'client' },
      },
    });
    const cookie = (response.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith(`${SESSION_COOKIE_NAME}=`));
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    const event = await lastAuditEvent('auth.sign-in', person.id);
    expect(event?.actorId).toBe(person.id);
  });

  it('accepts the e-mail address in any letter case and with surrounding spaces', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'] });
    const browser = await startBrowserSession(testApp.app);
    const response = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .send({ email: `  ${person.email.toUpperCase()} `, password: person.password });
    expect(response.status).toBe(200);
    expect(response.body.user.id).toBe(person.id);
  });

  it('refuses a wrong password and an unknown address with the same status and message', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'] });
    const browser = await startBrowserSession(testApp.app);

    const wrongPassword = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .send({ email: person.email, password: `${person.password}-not` });
    const unknownAddress = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .send({ email: `nobody-${uniqueSuffix()}@test.example`, password: person.password });

    expect(wrongPassword.status).toBe(401);
    expect(unknownAddress.status).toBe(401);
    expect(wrongPassword.body).toEqual({ error: { message: FAILED } });
    expect(unknownAddress.body).toEqual(wrongPassword.body);
    expect(cookieFromResponse(wrongPassword, SESSION_COOKIE_NAME)).toBeUndefined();

    const event = await lastAuditEvent('auth.sign-in-failed', person.id);
    expect(event?.actorId).toBeNull();
    expect(event?.details).toMatchObject({ email: person.email, reason: 'wrong-password' });
  });

  it('refuses an inactive person even with the right password', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['reviewer'], active: false });
    const browser = await startBrowserSession(testApp.app);
    const response = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .send({ email: person.email, password: person.password });
    expect(response.status).toBe(401);
    expect(response.body).toEqual({ error: { message: FAILED } });
  });

  it('answers a missing e-mail and a malformed e-mail with 400 and a sentence per field', async () => {
    const browser = await startBrowserSession(testApp.app);

    const missing = await browser.agent.post('/api/auth/sign-in').set(CSRF_HEADER_NAME, browser.csrfToken).send({ password: 'x' });
    expect(missing.status).toBe(400);
    expect(missing.body).toEqual({
      error: { message: 'Some fields need attention: email.', fields: { email: 'E-mail is required.' } },
    });

    const malformed = await browser.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, browser.csrfToken)
      .send({ email: 'not-an-address', password: '' });
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toEqual({
      email: 'E-mail must be a valid address, like name@lab.example.',
      password: 'Password is required.',
    });
  });

  it('gives a new session id at sign-in and the old id stops working', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['technician'] });
    const first = await signInAs(testApp.app, person);
    const firstCookie = first.sessionCookie;

    const again = await first.agent
      .post('/api/auth/sign-in')
      .set(CSRF_HEADER_NAME, first.csrfToken)
      .send({ email: person.email, password: person.password });
    expect(again.status).toBe(200);
    const secondCookie = cookieFromResponse(again, SESSION_COOKIE_NAME);
    expect(secondCookie).toBeDefined();
    expect(secondCookie).not.toBe(firstCookie);

    const withOldCookie = await request(testApp.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE_NAME}=${encodeURIComponent(firstCookie)}`);
    expect(withOldCookie.status).toBe(401);
    const withNewCookie = await request(testApp.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE_NAME}=${encodeURIComponent(secondCookie!)}`);
    expect(withNewCookie.status).toBe(200);
  });
});

describe('session', () => {
  it('keeps a person signed in across requests until sign-out', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['reviewer', 'technician'] });
    const session = await signInAs(testApp.app, person);

    for (let i = 0; i < 3; i += 1) {
      const me = await session.agent.get('/api/auth/me');
      expect(me.status).toBe(200);
      expect(me.body.user).toMatchObject({ id: person.id, roles: ['technician', 'reviewer'], organisation: null });
    }

    const signOut = await session.agent.post('/api/auth/sign-out').set(CSRF_HEADER_NAME, session.csrfToken);
    expect(signOut.status).toBe(204);
    expect((await session.agent.get('/api/auth/me')).status).toBe(401);
    expect((await lastAuditEvent('auth.sign-out', person.id))?.actorId).toBe(person.id);
  });

  it('ends an open session once the person is made inactive', async () => {
    const person = await createTestPerson(testApp.deps, { roles: ['admin'] });
    const session = await signInAs(testApp.app, person);
    expect((await session.agent.get('/api/auth/me')).status).toBe(200);

    await setPersonActive(testApp.deps, person.id, false);

    const me = await session.agent.get('/api/auth/me');
    expect(me.status).toBe(401);
    expect(me.body).toEqual({ error: { message: 'You need to sign in to do this.' } });
    // Reactivating does not revive the ended session.
    await setPersonActive(testApp.deps, person.id, true);
    expect((await session.agent.get('/api/auth/me')).status).toBe(401);
  });

  it('answers GET /api/auth/me with 401 and a JSON error for an anonymous visitor', async () => {
    const response = await request(testApp.app).get('/api/auth/me');
    expect(response.status).toBe(401);
    expect(response.body).toEqual({ error: { message: 'You need to sign in to do this.' } });
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 with a JSON error after the configured number of failed attempts for one address', async () => {
    const limited = createTestApp({ env: { SIGN_IN_RATE_LIMIT_MAX: '3', SIGN_IN_RATE_LIMIT_WINDOW_MS: '600000' } });
    try {
      const person = await createTestPerson(limited.deps, { roles: ['technician'] });
      const browser = await startBrowserSession(limited.app);
      const attempt = (password: string, email = person.email) =>
        browser.agent.post('/api/auth/sign-in').set(CSRF_HEADER_NAME, browser.csrfToken).send({ email, password });

      for (let i = 0; i < 3; i += 1) expect((await attempt('wrong')).status).toBe(401);
      const blocked = await attempt(person.password);
      expect(blocked.status).toBe(429);
      expect(blocked.body).toEqual({
        error: { message: 'Too many failed sign-in attempts for this address; wait 10 minute(s) and try again.' },
      });

      // The count is per address: another person from the same client still gets in.
      const other = await createTestPerson(limited.deps, { roles: ['reviewer'] });
      expect((await attempt(other.password, other.email)).status).toBe(200);
    } finally {
      await limited.close();
    }
  });
});
