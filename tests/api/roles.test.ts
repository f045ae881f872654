import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roleValues, type Role } from '../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { routeTable } from '../../server/routes/route-table';
import type { RouteSpec } from '../../server/routes/route-definition';
import { signedInWithRoles, startBrowserSession, type SignedInSession } from '../helpers/browser-session';
import { createTestPerson } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';

let testApp: TestApp;
const sessionsByRole = new Map<Role, SignedInSession>();

beforeAll(async () => {
  testApp = createTestApp();
  for (const role of roleValues) sessionsByRole.set(role, await signedInWithRoles(testApp, [role]));
});

afterAll(async () => {
  await testApp?.close();
});

/** A concrete URL for a route path: every `:param` becomes a well-formed id that matches nothing. */
function concretePath(route: RouteSpec): string {
  return route.path.replace(/:[A-Za-z]+/g, '00000000-0000-4000-8000-000000000000');
}

function send(session: { agent: request.Agent; csrfToken: string }, route: RouteSpec) {
  const call = session.agent[route.method](concretePath(route));
  return route.method === 'get' ? call : call.set(CSRF_HEADER_NAME, session.csrfToken).send({});
}

describe('route table', () => {
  it('lists GET /api/people as admin only, and auth and health as public or signed-in', () => {
    const byKey = new Map(routeTable.map((r) => [`${r.method} ${r.path}`, r.roles]));
    expect(byKey.get('get /api/people')).toEqual(['admin']);
    expect(byKey.get('get /api/health')).toBe('public');
    expect(byKey.get('post /api/auth/sign-in')).toBe('public');
    expect(byKey.get('get /api/auth/me')).toBe('signed-in');
  });

  const guarded = routeTable.filter((route) => route.roles !== 'public');

  it.each(guarded.map((route) => [`${route.method.toUpperCase()} ${route.path}`, route] as const))(
    '%s answers an anonymous visitor (with a valid CSRF token) with 401 and a JSON error',
    async (_name, route) => {
      const anonymous = await startBrowserSession(testApp.app);
      const response = await send(anonymous, route);
      expect(response.status).toBe(401);
      expect(response.body.error.message).toBe('You need to sign in to do this.');
    },
  );

  const cases = guarded.flatMap((route) =>
    roleValues.map((role) => {
      const allowed = route.roles === 'signed-in' || (route.roles as readonly Role[]).includes(role);
      return [`${route.method.toUpperCase()} ${route.path}`, role, allowed, route] as const;
    }),
  );

  it.each(cases)('%s as %s: allowed=%s', async (_name, role, allowed, route) => {
    const response = await send(sessionsByRole.get(role)!, route);
    if (allowed) {
      expect(response.status).not.toBe(401);
      expect(response.status).not.toBe(403);
    } else {
      expect(response.status).toBe(403);
      expect(response.body.error.message).toMatch(/^Your account does not have a role allowed to do this/);
    }
  });
});

describe('GET /api/people', () => {
  it('is refused with 403 to technician, reviewer and client', async () => {
    for (const role of ['technician', 'reviewer', 'client'] as const) {
      const response = await sessionsByRole.get(role)!.agent.get('/api/people');
      expect(response.status, role).toBe(403);
      expect(response.body).toEqual({
        error: { message: 'Your account does not have a role allowed to do this (needs: admin).' },
      });
    }
  });

  it('is refused with 401 to an anonymous visitor', async () => {
    expect((await request(testApp.app).get('/api/people')).status).toBe(401);
  });

  it('lists people with their roles for an admin, and filters by active', async () => {
    const inactive = await createTestPerson(testApp.deps, { roles: ['technician', 'reviewer'], active: false });
    const admin = sessionsByRole.get('admin')!;

    const all = await admin.agent.get('/api/people');
    expect(all.status).toBe(200);
    const listed = all.body.people.find((p: { id: string }) => p.id === inactive.id);
    expect(listed).toMatchObject({ email: inactive.email, active: false, roles: ['technician', 'reviewer'], organisation: null });
    expect(listed).not.toHaveProperty('passwordHash');

    const activeOnly = await admin.agent.get('/api/people?active=true');
    expect(activeOnly.body.people.some((p: { id: string }) => p.id === inactive.id)).toBe(false);
    expect(activeOnly.body.people.some((p: { id: string }) => p.id === admin.person.id)).toBe(true);

    const bad = await admin.agent.get('/api/people?active=maybe');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ active: 'Field "active" must be true or false.' });
  });

  it('is allowed to a person holding admin among other roles', async () => {
    const both = await signedInWithRoles(testApp, ['technician', 'admin']);
    expect((await both.agent.get('/api/people')).status).toBe(200);
  });
});
