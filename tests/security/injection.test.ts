/**
 * SQL-ish and HTML/script payloads in every text field the bench routes
 * take and in the filters, search and sort parameters of every list
 * endpoint of the route table: the answer is 2xx or 4xx, never 500; text is
 * stored and returned verbatim; JSON never carries a raw `<` a browser
 * could mistake for markup; sort keys come from a whitelist.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { roleValues, type Role } from '../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../server/middleware/csrf';
import { routeTable } from '../../server/routes/route-table';
import { signedInWithRoles, type SignedInSession } from '../helpers/browser-session';
import { createTestOrganisation, uniqueSuffix } from '../helpers/people';
import { createTestApp, type TestApp } from '../helpers/test-app';
import { concretePath, routeName, STATE_CHANGING_METHODS } from './route-requests';

/** Classic probes (OWASP Testing Guide: SQL injection, XSS filter evasion), from memory. */
const PAYLOADS = [
  "' OR '1'='1",
  "'; DROP TABLE work_orders; --",
  '" OR ""="',
  "1) UNION SELECT password_hash FROM people --",
  '%_\\',
  '<script>alert("paraxia")</script>',
  '"><img src=x onerror=alert(1)>',
  '</textarea><svg onload=alert(1)>',
  '{{7*7}} ${7*7} #{7*7}',
  'Brennweite ø25 – 焦点 \u202e',
];

let testApp: TestApp;
let clientOrganisationId: string;
const sessions = new Map<Role, SignedInSession>();

beforeAll(async () => {
  testApp = createTestApp();
  clientOrganisationId = (await createTestOrganisation(testApp.deps, { kind: 'client', name: `Harlow Optics ${uniqueSuffix()}` })).id;
  for (const role of roleValues) {
    sessions.set(role, await signedInWithRoles(testApp, [role], { organisationId: role === 'client' ? clientOrganisationId : null }));
  }
});

afterAll(async () => {
  await testApp?.close();
});

function technician() {
  return sessions.get('technician')!;
}

function send<T extends { set(name: string, value: string): T }>(session: SignedInSession, call: T): T {
  return call.set(CSRF_HEADER_NAME, session.csrfToken);
}

/** No raw markup in a JSON body: Express's `json escape` writes <, > and & as \u003c, \u003e, \u0026. */
function expectEscapedJson(text: string) {
  expect(text).not.toMatch(/[<>]/);
}

describe('text fields keep hostile text verbatim', () => {
  it.each(PAYLOADS)('work order title, client reference and notes: %j', async (payload) => {
    const tech = technician();
    const title = `${payload} ${uniqueSuffix()}`;
    const created = await send(tech, tech.agent.post('/api/work-orders')).send({
      organisationId: clientOrganisationId,
      title,
      clientReference: payload.slice(0, 100),
      notes: payload,
      decisionRule: 'simple',
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const read = await tech.agent.get(`/api/work-orders/${created.body.workOrder.id}`);
    expect(read.status).toBe(200);
    expect(read.headers['content-type']).toMatch(/^application\/json/);
    expect(read.body.workOrder).toMatchObject({ title: title.trim(), clientReference: payload.slice(0, 100).trim(), notes: payload.trim() });
    expectEscapedJson(read.text);

    // The search takes the payload as plain text and finds exactly that work order.
    const found = await tech.agent.get('/api/work-orders').query({ q: title });
    expect(found.status).toBe(200);
    expect(found.body.items.map((item: { id: string }) => item.id)).toEqual([created.body.workOrder.id]);
    expectEscapedJson(found.text);
  });

  it.each(PAYLOADS)('lens identifier, description and part number: %j', async (payload) => {
    const tech = technician();
    const workOrder = await send(tech, tech.agent.post('/api/work-orders')).send({ organisationId: clientOrganisationId, title: `Lens host ${uniqueSuffix()}`, decisionRule: 'simple' });
    const identifier = `${payload} ${uniqueSuffix()}`.trim();
    const lens = await send(tech, tech.agent.post(`/api/work-orders/${workOrder.body.workOrder.id}/lenses`)).send({
      identifier,
      description: payload,
      partNumber: payload.slice(0, 100),
      nominalFocalLengthMm: 100,
      tolerancePercent: 2,
    });
    expect(lens.status, JSON.stringify(lens.body)).toBe(201);
    const read = await tech.agent.get(`/api/lenses/${lens.body.lens.id}`);
    expect(read.status).toBe(200);
    expect(read.body.lens).toMatchObject({ identifier, description: payload.trim(), partNumber: payload.slice(0, 100).trim() });
    expectEscapedJson(read.text);
    const spread = await tech.agent.get(`/api/part-numbers/${encodeURIComponent(payload.slice(0, 100).trim())}/spread`);
    expect(spread.status, JSON.stringify(spread.body)).toBeLessThan(500);
  });

  it.each(PAYLOADS)('equipment identifier, description, serial number and calibration reference: %j', async (payload) => {
    const admin = sessions.get('admin')!;
    const identifier = `${payload.slice(0, 40)} ${uniqueSuffix()}`.trim();
    const created = await send(admin, admin.agent.post('/api/equipment')).send({
      kind: 'rail-scale',
      identifier,
      description: payload,
      serialNumber: payload,
      calibrationReference: payload,
      calibrationDueDate: '2099-12-31',
      values: { uncertaintyMm: 0.02 },
    });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body.equipment).toMatchObject({ identifier, description: payload.trim(), serialNumber: payload.trim(), calibrationReference: payload.trim() });
    expectEscapedJson(created.text);
    const listed = await technician().agent.get('/api/equipment').query({ q: identifier });
    expect(listed.status).toBe(200);
    expect(listed.body.items.map((item: { id: string }) => item.id)).toEqual([created.body.equipment.id]);
  });

  it('treats % and _ in a search as the characters themselves, not as wildcards', async () => {
    const tech = technician();
    const stem = `wild-${uniqueSuffix()}`;
    const created = await send(tech, tech.agent.post('/api/work-orders')).send({ organisationId: clientOrganisationId, title: `${stem}-aXb`, decisionRule: 'simple' });
    expect(created.status).toBe(201);
    for (const q of [`${stem}-a%b`, `${stem}-a_b`, `${stem}%`]) {
      const response = await tech.agent.get('/api/work-orders').query({ q });
      expect(response.status).toBe(200);
      expect(response.body.items, q).toEqual([]);
    }
    expect((await tech.agent.get('/api/work-orders').query({ q: `${stem}-axb` })).body.items).toHaveLength(1);
  });

  it('answers text holding a NUL character with 400 naming the field, not a database error', async () => {
    const tech = technician();
    const response = await send(tech, tech.agent.post('/api/work-orders')).send({ organisationId: clientOrganisationId, title: 'before\u0000after', decisionRule: 'simple' });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({ title: 'Field "title" must not contain a NUL character (U+0000).' });
    const search = await tech.agent.get('/api/work-orders').query({ q: 'a\u0000b' });
    expect(search.status).toBe(400);
    expect(search.body.error.fields).toEqual({ q: 'Field "q" must not contain a NUL character (U+0000).' });
  });
});

describe('sorting is restricted to a whitelist', () => {
  const listsWithSort = ['/api/work-orders', '/api/measurements'];
  const badSorts = ['title; DROP TABLE work_orders', 'number desc', '(select 1)', 'password_hash', 'createdAt,number', ''];

  it.each(listsWithSort.flatMap((path) => badSorts.map((sort) => [path, sort] as const)))('%s?sort=%j answers 400 naming the field', async (path, sort) => {
    const response = await technician().agent.get(path).query({ sort });
    expect(response.status).toBe(400);
    expect(response.body.error.fields.sort).toMatch(/^Field "sort" must be one of: /);
  });

  it.each(listsWithSort)('%s refuses an order other than asc or desc, and a parameter it does not know', async (path) => {
    const order = await technician().agent.get(path).query({ order: 'asc; select pg_sleep(5)' });
    expect(order.status).toBe(400);
    expect(order.body.error.fields.order).toBe('Field "order" must be "asc" or "desc".');
    const unknown = await technician().agent.get(path).query({ orderBy: 'password_hash' });
    expect(unknown.status).toBe(400);
  });
});

/** Query parameters list endpoints take, or might take tomorrow, each given every payload. */
const FILTER_NAMES = ['q', 'search', 'sort', 'order', 'status', 'kind', 'action', 'actor', 'organisationId', 'from', 'to', 'page', 'pageSize', 'active', 'mine'];

describe('every GET route of the table survives hostile query parameters', () => {
  const getRoutes = routeTable.filter((route) => route.method === 'get');
  const caseList = getRoutes.map((route) => {
    const role: Role = route.roles === 'public' || route.roles === 'signed-in' ? 'admin' : route.roles.includes('admin') ? 'admin' : route.roles[0];
    return [routeName(route), role, route] as const;
  });

  it.each(caseList)('%s as %s: every filter name with each payload, and each name alone, answers below 500', async (_name, role, route) => {
    const session = sessions.get(role)!;
    const path = concretePath(route);
    const queries = [
      ...PAYLOADS.map((payload) => Object.fromEntries(FILTER_NAMES.map((name) => [name, payload]))),
      ...FILTER_NAMES.map((name) => ({ [name]: PAYLOADS[1] })),
    ];
    for (const query of queries) {
      const response = await session.agent.get(path).query(query);
      expect(response.status, `${JSON.stringify(query)}: ${JSON.stringify(response.body)}`).toBeLessThan(500);
      if (String(response.headers['content-type']).startsWith('application/json')) expectEscapedJson(response.text);
    }
  });
});

describe('every state-changing route of the table survives hostile bodies', () => {
  const FIELD_NAMES = ['title', 'name', 'email', 'identifier', 'description', 'notes', 'comment', 'reason', 'clientReference', 'text', 'password', 'partNumber', 'serialNumber'];
  const routes = stateChangingRoutesExceptSignOut();

  function stateChangingRoutesExceptSignOut() {
    return routeTable.filter((route) => STATE_CHANGING_METHODS.includes(route.method) && routeName(route) !== 'POST /api/auth/sign-out');
  }

  it.each(routes.map((route) => [routeName(route), route] as const))('%s answers below 500 when every text field holds a payload', async (_name, route) => {
    const role: Role = route.roles === 'public' || route.roles === 'signed-in' ? 'technician' : route.roles[0];
    const session = sessions.get(role)!;
    for (const payload of PAYLOADS) {
      const body = Object.fromEntries(FIELD_NAMES.map((field) => [field, payload]));
      const response = await session.agent[route.method](concretePath(route)).set(CSRF_HEADER_NAME, session.csrfToken).send(body);
      expect(response.status, `${JSON.stringify(payload)}: ${JSON.stringify(response.body)}`).toBeLessThan(500);
      expectEscapedJson(response.text);
    }
  });
});
