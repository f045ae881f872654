import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roleValues, type Role } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { frameRoutes } from '../../../server/routes/frames/frames.routes';
import { measurementRoutes } from '../../../server/routes/measurements/measurements.routes';
import type { RouteSpec } from '../../../server/routes/route-definition';
import { sweepRoutes } from '../../../server/routes/sweeps/sweeps.routes';
import { storeFrameFromStream } from '../../../server/services/frame-storage';
import { signedInWithRoles, startBrowserSession, type BrowserSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestBench, createTestLens, createTestWorkOrder, finiteConjugateBody } from './bench-records';
import { readUploadFixture } from './upload-fixtures';

const STAFF_READ: readonly Role[] = ['technician', 'reviewer', 'admin'];
const TECHNICIAN_ONLY: readonly Role[] = ['technician'];

/** The contract (docs/api-bench.md): reads for T R A, changes for T; clients never. */
const expectedRoles: Record<string, readonly Role[]> = {
  'get /api/measurements': STAFF_READ,
  'post /api/measurements': TECHNICIAN_ONLY,
  'get /api/measurements/:measurementId': STAFF_READ,
  'patch /api/measurements/:measurementId': TECHNICIAN_ONLY,
  'post /api/measurements/:measurementId/sweeps': TECHNICIAN_ONLY,
  'patch /api/sweeps/:sweepId': TECHNICIAN_ONLY,
  'delete /api/sweeps/:sweepId': TECHNICIAN_ONLY,
  'post /api/sweeps/:sweepId/frames': TECHNICIAN_ONLY,
  'put /api/sweeps/:sweepId/readings': TECHNICIAN_ONLY,
  'get /api/frames/:frameId/thumbnail': STAFF_READ,
  'get /api/frames/:frameId/preview': STAFF_READ,
  'get /api/frames/:frameId/original': STAFF_READ,
  'patch /api/frames/:frameId': TECHNICIAN_ONLY,
  'delete /api/frames/:frameId': TECHNICIAN_ONLY,
};

const routes: RouteSpec[] = [...measurementRoutes, ...sweepRoutes, ...frameRoutes];

let testApp: TestApp;
const sessions = new Map<Role, BrowserSession>();
const realIds: Record<string, string> = {};

beforeAll(async () => {
  testApp = createTestApp();
  for (const role of roleValues) sessions.set(role, await signedInWithRoles(testApp, [role]));
  const technician = sessions.get('technician')!;
  const bench = await createTestBench(testApp.deps);
  const lens = await createTestLens(testApp.deps, (await createTestWorkOrder(testApp.deps)).workOrder.id);
  const created = await technician.agent.post('/api/measurements').set(CSRF_HEADER_NAME, technician.csrfToken).send(finiteConjugateBody(lens.id, bench));
  realIds.measurementId = created.body.measurement.id;
  realIds.sweepId = created.body.measurement.sweeps[0].id;
  const frame = await storeFrameFromStream(testApp.deps, {
    sweepId: realIds.sweepId,
    fileName: 'role-check.png',
    stream: Readable.from([await readUploadFixture('dot-pair-8bit.png')]),
  });
  realIds.frameId = frame.id;
});

afterAll(async () => {
  await testApp?.close();
});

/** Reads go to real records (so an allowed role gets 200); changes go to ids that match nothing, so the checks change nothing. */
function pathFor(route: RouteSpec): string {
  return route.path.replace(/:([A-Za-z]+)/g, (_, name: string) => (route.method === 'get' ? realIds[name] : '00000000-0000-4000-8000-000000000000'));
}

function send(session: BrowserSession, route: RouteSpec) {
  const call = session.agent[route.method](pathFor(route));
  return route.method === 'get' ? call : call.set(CSRF_HEADER_NAME, session.csrfToken).send({});
}

describe('measurement, sweep and frame routes', () => {
  it('are exactly the routes of the contract, with its roles', () => {
    expect(Object.fromEntries(routes.map((r) => [`${r.method} ${r.path}`, r.roles]))).toEqual(expectedRoles);
  });

  it.each(routes.map((route) => [`${route.method.toUpperCase()} ${route.path}`, route] as const))('%s answers an anonymous visitor with 401', async (_name, route) => {
    const response = await send(await startBrowserSession(testApp.app), route);
    expect(response.status).toBe(401);
  });

  const cases = routes.flatMap((route) =>
    roleValues.map((role) => [`${route.method.toUpperCase()} ${route.path}`, role, (expectedRoles[`${route.method} ${route.path}`] ?? []).includes(role), route] as const),
  );

  it.each(cases)('%s as %s: allowed=%s', async (_name, role, allowed, route) => {
    const response = await send(sessions.get(role)!, route);
    if (!allowed) {
      expect(response.status).toBe(403);
      expect(response.body.error.message).toMatch(/^Your account does not have a role allowed to do this/);
    } else if (route.method === 'get') {
      expect(response.status).toBe(200);
    } else {
      expect([400, 404, 415]).toContain(response.status);
    }
  });
});
