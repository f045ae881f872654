/**
 * CSRF on every state-changing route of the route table, sessions that
 * cannot be fixed or replayed, and the sign-in rate limit's answer.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roleValues, type Role } from '../../server/db/schema';
import { CSRF_HEADER_NAME, CSRF_MISSING_MESSAGE } from '../../server/middleware/csrf';
import { SESSION_COOKIE_NAME } from '../../server/middleware/session';
import { routeTable } from '../../server/routes/route-table';
import type { RouteSpec } from '../../server/routes/route-definition';
import { cookieFromResponse, signInAs, signedInWithRoles, startBrowserSession, type BrowserSession } from '../helpers/browser-session';
import { createTestOrganisation, createTestPerson, uniqueSuffix } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { callRoute, routeName, STATE_CHANGING_METHODS } from './route-requests';

let testApp: TestApp;
let clientOrganisationId: string;

beforeAll(async () => {
  testApp = createTestApp();
  clientOrganisationId = (await createTestOrganisation(testApp.deps, { kind: 'client' })).id;
});

afterAll(async () => {
  await testApp?.close();
});

/** A browser that may call the route: anonymous for a public route, else signed in with its first allowed role. */
async function callerFor(route: RouteSpec): Promise<BrowserSession> {
  if (route.roles === 'public') return startBrowserSession(testApp.app);
  const role: Role = route.roles === 'signed-in' ? roleValues[0] : route.roles[0];
  return signedInWithRoles(testApp, [role], { organisationId: role === 'client' ? clientOrganisationId : null });
}

const stateChanging = routeTable.filter((route) => STATE_CHANGING_METHODS.includes(route.method));

describe('CSRF double-submit on every state-changing route', () => {
  it('covers at least the sign-in, upload and analysis routes (the table is read, not copied)', () => {
    const names = stateChanging.map(routeName);
    expect(names).toContain('POST /api/auth/sign-in');
    expect(names).toContain('POST /api/sweeps/:sweepId/frames');
    expect(names).toContain('POST /api/measurements/:measurementId/analyses');
  });

  it.each(stateChanging.map((route) => [routeName(route), route] as const))(
    '%s refuses a missing or wrong x-csrf-token with 403, and the right one passes the check',
    async (_name, route) => {
      const caller = await callerFor(route);

      const missing = await callRoute(caller, route, { csrf: 'none' });
      expect(missing.status).toBe(403);
      expect(missing.body).toEqual({ error: { message: CSRF_MISSING_MESSAGE } });

      const wrong = await callRoute(caller, route, { csrf: 'wrong' });
      expect(wrong.status).toBe(403);
      expect(wrong.body).toEqual({ error: { message: CSRF_MISSING_MESSAGE } });

      // The control: the same caller with the right token gets past the check (404, 400 or success), so the 403s above were CSRF's.
      const right = await callRoute(caller, route, { csrf: 'right' });
      expect(right.status, JSON.stringify(right.body)).not.toBe(403);
      expect(right.status).toBeLessThan(500);
    },
  );

  it('refuses a token sent only in the header when the browser holds a different cookie', async () => {
    const victim = await signedInWithRoles(testApp, ['technician']);
    const attacker = await startBrowserSession(testApp.app);
    const forged = await victim.agent.post('/api/work-orders').set(CSRF_HEADER_NAME, attacker.csrfToken).send({});
    expect(forged.status).toBe(403);
  });
});

describe('sessions', () => {
  it('issues a session cookie only at sign-in: an anonymous visit stores no session to plant', async () => {
    const anonymous = await request(testApp.app).get('/api/auth/me');
    expect(cookieFromResponse(anonymous, SESSION_COOKIE_NAME)).toBeUndefined();
  });

  it('gives a second person signing in on the same browser a new id, and the first id stops working', async () => {
    const first = await signedInWithRoles(testApp, ['technician']);
    const secondPerson = await createTestPerson(testApp.deps, { roles: ['reviewer'] });
    const second = await signInAs(testApp.app, secondPerson, first);
    expect(second.sessionCookie).not.toBe(first.sessionCookie);
    const replayed = await request(testApp.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE_NAME}=${encodeURIComponent(first.sessionCookie)}`);
    expect(replayed.status).toBe(401);
    expect((await second.agent.get('/api/auth/me')).body.user.id).toBe(secondPerson.id);
  });

  it('ends the session on the server at sign-out: the old cookie replayed later is refused', async () => {
    const session = await signedInWithRoles(testApp, ['admin']);
    expect((await session.agent.post('/api/auth/sign-out').set(CSRF_HEADER_NAME, session.csrfToken)).status).toBe(204);
    const replayed = await request(testApp.app).get('/api/people').set('Cookie', `${SESSION_COOKIE_NAME}=${encodeURIComponent(session.sessionCookie)}`);
    expect(replayed.status).toBe(401);
  });

  it('refuses a session cookie whose signature was tampered with', async () => {
    const session = await signedInWithRoles(testApp, ['admin']);
    const tampered = session.sessionCookie.replace(/.$/, (last) => (last === 'A' ? 'B' : 'A'));
    const response = await request(testApp.app).get('/api/people').set('Cookie', `${SESSION_COOKIE_NAME}=${encodeURIComponent(tampered)}`);
    expect(response.status).toBe(401);
  });
});

describe('rate limits', () => {
  it('answers sign-in attempts over the limit with 429, a sentence, Retry-After and the IETF RateLimit headers', async () => {
    const limited = createTestApp({ env: { SIGN_IN_RATE_LIMIT_MAX: '2', SIGN_IN_RATE_LIMIT_WINDOW_MS: '120000' } });
    try {
      const person = await createTestPerson(limited.deps, { roles: ['technician'] });
      const browser = await startBrowserSession(limited.app);
      const attempt = (password: string) => browser.agent.post('/api/auth/sign-in').set(CSRF_HEADER_NAME, browser.csrfToken).send({ email: person.email, password });
      expect((await attempt('wrong-1')).status).toBe(401);
      expect((await attempt('wrong-2')).status).toBe(401);

      const blocked = await attempt(person.password);
      expect(blocked.status).toBe(429);
      expect(blocked.headers['content-type']).toMatch(/application\/json/);
      expect(blocked.body).toEqual({ error: { message: 'Too many failed sign-in attempts for this address; wait 2 minute(s) and try again.' } });
      // draft-ietf-httpapi-ratelimit-headers-08 (express-rate-limit's 'draft-8'): RateLimit-Policy and RateLimit; Retry-After per RFC 9110 §10.2.3.
      expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
      expect(Number(blocked.headers['retry-after'])).toBeLessThanOrEqual(120);
      expect(blocked.headers['ratelimit-policy']).toMatch(/q=2; w=120/);
      expect(blocked.headers['ratelimit']).toMatch(/r=0/);
      expect(cookieFromResponse(blocked, SESSION_COOKIE_NAME)).toBeUndefined();
    } finally {
      await limited.close();
    }
  });

  it('answers password-link requests over the limit for one address with 429, a sentence and the RateLimit headers', async () => {
    const limited = createTestApp({ env: { PASSWORD_RESET_RATE_LIMIT_MAX: '2', SIGN_IN_RATE_LIMIT_WINDOW_MS: '120000' } });
    try {
      const browser = await startBrowserSession(limited.app);
      const email = `reset-${Date.now()}@test.example`;
      const ask = () => browser.agent.post('/api/password-reset-requests').set(CSRF_HEADER_NAME, browser.csrfToken).send({ email });
      for (let i = 0; i < 2; i++) expect((await ask()).status).toBe(202);
      const blocked = await ask();
      expect(blocked.status).toBe(429);
      expect(blocked.body).toEqual({ error: { message: 'Too many password links were asked for this address; wait 2 minute(s) and try again.' } });
      expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
      expect(blocked.headers['ratelimit-policy']).toMatch(/q=2; w=120/);
    } finally {
      await limited.close();
    }
  });

  it('answers certificate look-ups over the per-address budget with 429, a sentence and Retry-After', async () => {
    const limited = createTestApp();
    try {
      const browser = await startBrowserSession(limited.app);
      const lookUp = () => browser.agent.get(`/api/verification/${uniqueSuffix()}${uniqueSuffix()}`);
      // The budget is 60 look-ups per 15 minutes (server/routes/verification/verification.handlers.ts).
      for (let i = 0; i < 60; i++) expect((await lookUp()).status, `look-up ${i + 1}`).not.toBe(429);
      const blocked = await lookUp();
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.message).toMatch(/^Too many certificate checks from this address; wait up to \d+ minutes and try again\.$/);
      expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
      expect(blocked.headers['ratelimit']).toMatch(/r=0/);
    } finally {
      await limited.close();
    }
  });
});
