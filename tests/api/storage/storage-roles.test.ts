import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import type { Role } from '../../../server/db/schema';
import { storageRoutes } from '../../../server/routes/storage/storage.routes';
import { signedInWithRoles, startBrowserSession, type BrowserSession } from '../../helpers/browser-session';
import { createTestOrganisation } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';

let testApp: TestApp;

beforeAll(() => {
  testApp = createTestApp();
});

afterAll(async () => {
  await testApp?.close();
});

function call(session: BrowserSession, method: string, path: string) {
  const agent = session.agent;
  if (method === 'get') return agent.get(path);
  return agent.post(path).set(CSRF_HEADER_NAME, session.csrfToken).send({});
}

describe('storage routes are for admins only', () => {
  it('every storage route is declared admin-only in the route table', () => {
    expect(storageRoutes.length).toBe(6);
    for (const route of storageRoutes) expect(route.roles, `${route.method} ${route.path}`).toEqual(['admin']);
  });

  it('anonymous callers get 401 on every storage route', async () => {
    const anonymous = await startBrowserSession(testApp.app);
    for (const route of storageRoutes) {
      const response = await call(anonymous, route.method, route.path);
      expect(response.status, `${route.method} ${route.path}`).toBe(401);
    }
  });

  it.each<Role>(['technician', 'reviewer', 'client'])('a %s gets 403 on every storage route', async (role) => {
    const organisation = role === 'client' ? await createTestOrganisation(testApp.deps, { kind: 'client' }) : null;
    const session = await signedInWithRoles(testApp, [role], { organisationId: organisation?.id ?? null });
    for (const route of storageRoutes) {
      const response = await call(session, route.method, route.path);
      expect(response.status, `${route.method} ${route.path}`).toBe(403);
    }
  });

  it('an admin reads the settings', async () => {
    const admin = await signedInWithRoles(testApp, ['admin']);
    const response = await admin.agent.get('/api/storage/settings');
    expect(response.status).toBe(200);
    expect(response.body.settings).toEqual({ retentionDefaultDays: 365, orphanMinimumAgeMinutes: 60 });
  });
});
