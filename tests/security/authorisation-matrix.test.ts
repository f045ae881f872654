/**
 * Every route of the route table × anonymous and each role. The expected
 * status comes from the table itself, so a route added tomorrow is checked
 * the day it lands; a short hand-written list pins which routes may be
 * public at all, so a route made public by mistake fails here.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roleValues, type Role } from '../../server/db/schema';
import { SIGN_IN_REQUIRED_MESSAGE } from '../../server/middleware/require-role';
import { routeTable } from '../../server/routes/route-table';
import { signedInWithRoles, startBrowserSession, type SignedInSession } from '../helpers/browser-session';
import { createTestOrganisation } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { callRoute, roleIsAllowed, routeName } from './route-requests';

/**
 * Every route open to people without an account, written out by hand: the
 * service's health, signing in and out, a certificate's public verification,
 * and the links mailed for resetting a password or accepting an invitation.
 * A route made public by mistake, or one of these locked away, fails here.
 */
const PUBLIC_ROUTES = [
  'GET /api/health',
  'POST /api/auth/sign-in',
  'POST /api/auth/sign-out',
  'POST /api/password-reset-requests',
  'GET /api/password-reset-links/:token',
  'POST /api/password-reset-links/:token',
  'GET /api/invitation-links/:token',
  'POST /api/invitation-links/:token',
  'GET /api/verification/:code',
  'POST /api/verification/:code/document',
].sort();

/** Calling these ends the caller's session, so each such call gets a session of its own. */
const SESSION_ENDING = new Set(['POST /api/auth/sign-out']);

let testApp: TestApp;
let clientOrganisationId: string;
const sessionsByRole = new Map<Role, SignedInSession>();

function signedInAs(role: Role): Promise<SignedInSession> {
  return signedInWithRoles(testApp, [role], { organisationId: role === 'client' ? clientOrganisationId : null });
}

beforeAll(async () => {
  testApp = createTestApp();
  clientOrganisationId = (await createTestOrganisation(testApp.deps, { kind: 'client' })).id;
  for (const role of roleValues) sessionsByRole.set(role, await signedInAs(role));
});

afterAll(async () => {
  await testApp?.close();
});

describe('which routes are public', () => {
  const publicRoutes = routeTable.filter((route) => route.roles === 'public').map(routeName);

  it('are exactly the hand-written list', () => {
    expect([...publicRoutes].sort()).toEqual(PUBLIC_ROUTES);
  });

  it('do not include the signed-in person\'s own record (GET /api/auth/me needs a session)', () => {
    expect(routeTable.find((route) => routeName(route) === 'GET /api/auth/me')?.roles).toBe('signed-in');
  });

  it('names at least one role for every role-restricted route', () => {
    for (const route of routeTable) {
      if (typeof route.roles === 'string') expect(['public', 'signed-in'], routeName(route)).toContain(route.roles);
      else expect(route.roles.length, routeName(route)).toBeGreaterThan(0);
    }
  });
});

describe('an anonymous visitor', () => {
  it.each(routeTable.map((route) => [routeName(route), route] as const))('%s: 401 unless public, and never 403 from the access check', async (_name, route) => {
    const anonymous = await startBrowserSession(testApp.app);
    const response = await callRoute(anonymous, route);
    expect(String(response.headers['content-type'] ?? ''), 'a JSON answer (or none), never the HTML page').not.toMatch(/text\/html/);
    if (route.roles === 'public') {
      expect(response.status).not.toBe(401);
      expect(response.status).not.toBe(403);
      expect(response.status).toBeLessThan(500);
    } else {
      expect(response.status).toBe(401);
      expect(response.body).toEqual({ error: { message: SIGN_IN_REQUIRED_MESSAGE } });
    }
  });
});

describe('each role', () => {
  const cases = routeTable.flatMap((route) => roleValues.map((role) => [routeName(route), role, roleIsAllowed(route, role), route] as const));

  it.each(cases)('%s as %s (allowed: %s): 403 when not allowed, otherwise the handler runs', async (_name, role, allowed, route) => {
    const session = SESSION_ENDING.has(routeName(route)) ? await signedInAs(role) : sessionsByRole.get(role)!;
    const response = await callRoute(session, route);
    if (allowed) {
      expect(response.status).not.toBe(401);
      expect(response.status).not.toBe(403);
      // Unknown ids and empty bodies are the caller's fault: 4xx with a sentence, never a server error.
      expect(response.status, JSON.stringify(response.body)).toBeLessThan(500);
    } else {
      expect(response.status).toBe(403);
      expect(response.body.error.message).toMatch(/^Your account does not have a role allowed to do this \(needs: .+\)\.$/);
    }
  });
});
