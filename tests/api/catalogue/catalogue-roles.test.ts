/**
 * Every catalogue route × every role, as docs/api-bench.md states it
 * (T technician, R reviewer, A admin, C client; anonymous → 401). The table
 * below is copied from the contract, not from the route table, so a route
 * registered with the wrong roles fails here.
 */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Role } from '../../../server/db/schema';
import { routeTable } from '../../../server/routes/route-table';
import { signedInWithRoles, startBrowserSession, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { insertLens, insertWorkOrder, sendJson } from './catalogue-fixtures';

type Method = 'get' | 'post' | 'patch';
const ROLE_BY_LETTER: Record<string, Role> = { T: 'technician', R: 'reviewer', A: 'admin', C: 'client' };
const ALL_ROLES: Role[] = ['technician', 'reviewer', 'admin', 'client'];

const contract: [Method, string, string][] = [
  ['get', '/api/organisations', 'TRA'],
  ['get', '/api/work-orders', 'TRAC'],
  ['post', '/api/work-orders', 'TA'],
  ['get', '/api/work-orders/:workOrderId', 'TRAC'],
  ['patch', '/api/work-orders/:workOrderId', 'TA'],
  ['post', '/api/work-orders/:workOrderId/lenses', 'TA'],
  ['get', '/api/lenses/:lensId', 'TRAC'],
  ['patch', '/api/lenses/:lensId', 'TA'],
  ['get', '/api/part-numbers/:partNumber/spread', 'TRA'],
  ['get', '/api/equipment', 'TRA'],
  ['post', '/api/equipment', 'A'],
  ['patch', '/api/equipment/:equipmentId', 'A'],
];

let testApp: TestApp;
const sessions = new Map<Role, SignedInSession>();
let params: Record<string, string>;

beforeAll(async () => {
  testApp = createTestApp();
  const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
  for (const role of ALL_ROLES) {
    sessions.set(role, await signedInWithRoles(testApp, [role], { organisationId: role === 'client' ? organisation.id : null }));
  }
  const order = await insertWorkOrder(testApp.deps.db, { organisationId: organisation.id });
  const partNumber = `ROLE-${uniqueSuffix()}`;
  const lens = await insertLens(testApp.deps.db, { workOrderId: order.id, partNumber });
  const equipment = await sendJson(sessions.get('admin')!, 'post', '/api/equipment', {
    kind: 'rail-scale',
    identifier: `RAIL-ROLE-${uniqueSuffix()}`,
    values: { uncertaintyMm: 0.02 },
    calibrationReference: 'CAL-ROLE',
    calibrationDueDate: '2099-01-01',
  });
  params = { workOrderId: order.id, lensId: lens.id, partNumber, equipmentId: equipment.body.equipment.id };
});

afterAll(async () => {
  await testApp?.close();
});

function concrete(path: string): string {
  return path.replace(/:([A-Za-z]+)/g, (_, name: string) => params[name]);
}

function call(session: { agent: request.Agent; csrfToken: string }, method: Method, path: string) {
  return method === 'get' ? session.agent.get(concrete(path)) : sendJson(session, method, concrete(path), {});
}

describe('catalogue routes', () => {
  it('are registered with exactly the roles the contract gives them', () => {
    for (const [method, path, letters] of contract) {
      const route = routeTable.find((r) => r.method === method && r.path === path);
      expect(route, `${method} ${path}`).toBeDefined();
      expect([...(route!.roles as Role[])].sort(), `${method} ${path}`).toEqual([...letters].map((l) => ROLE_BY_LETTER[l]).sort());
    }
  });

  it.each(contract)('%s %s answers an anonymous visitor with 401', async (method, path) => {
    const anonymous = await startBrowserSession(testApp.app);
    const response = await call(anonymous, method, path);
    expect(response.status).toBe(401);
    expect(response.body.error.message).toBe('You need to sign in to do this.');
  });

  const cases = contract.flatMap(([method, path, letters]) =>
    ALL_ROLES.map((role) => [method, path, role, [...letters].map((l) => ROLE_BY_LETTER[l]).includes(role)] as const),
  );

  // An allowed GET reads the real record (200); an allowed change with an empty body reaches validation (400).
  it.each(cases)('%s %s as %s: allowed=%s', async (method, path, role, allowed) => {
    const response = await call(sessions.get(role)!, method, path);
    if (allowed) expect(response.status, JSON.stringify(response.body)).toBe(method === 'get' ? 200 : 400);
    else {
      expect(response.status).toBe(403);
      expect(response.body.error.message).toMatch(/^Your account does not have a role allowed to do this/);
    }
  });
});
