import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { WorkOrderListItem } from '../../../shared/schemas/work-orders';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { insertLens, insertMeasurement, insertWorkOrder, latestAuditEvent, sendJson } from './catalogue-fixtures';

let testApp: TestApp;
let technician: SignedInSession;
let reviewer: SignedInSession;
let clientA: SignedInSession;
let clientB: SignedInSession;
let orgA: { id: string; name: string };
let orgB: { id: string; name: string };
let lab: { id: string; name: string };

beforeAll(async () => {
  testApp = createTestApp();
  orgA = await createTestOrganisation(testApp.deps, { kind: 'client', name: `Aldergrove Optics ${uniqueSuffix()}` });
  orgB = await createTestOrganisation(testApp.deps, { kind: 'client', name: `Brindle Lensworks ${uniqueSuffix()}` });
  lab = await createTestOrganisation(testApp.deps, { kind: 'lab' });
  technician = await signedInWithRoles(testApp, ['technician']);
  reviewer = await signedInWithRoles(testApp, ['reviewer']);
  clientA = await signedInWithRoles(testApp, ['client'], { organisationId: orgA.id });
  clientB = await signedInWithRoles(testApp, ['client'], { organisationId: orgB.id });
});

afterAll(async () => {
  await testApp?.close();
});

const ids = (items: { id: string }[]) => items.map((item) => item.id);

describe('POST /api/work-orders', () => {
  it('opens a work order with the next WO-YYYY-NNNN number and records work-order.created', async () => {
    const response = await sendJson(technician, 'post', '/api/work-orders', {
      organisationId: orgA.id,
      title: '  Incoming check of condenser lenses  ',
      clientReference: 'PO-881',
      dueDate: '2026-09-30',
      decisionRule: 'guarded',
      notes: 'Handle with gloves.',
    });
    expect(response.status).toBe(201);
    const { workOrder } = response.body;
    const year = new Date().getFullYear();
    expect(workOrder.number).toMatch(new RegExp(`^WO-${year}-\\d{4,}$`));
    expect(workOrder).toMatchObject({
      title: 'Incoming check of condenser lenses',
      clientReference: 'PO-881',
      organisation: { id: orgA.id, name: orgA.name },
      status: 'open',
      dueDate: '2026-09-30',
      decisionRule: 'guarded',
      notes: 'Handle with gloves.',
      lensCount: 0,
      measurementCount: 0,
      createdBy: { id: technician.person.id, name: technician.person.name },
      lenses: [],
    });
    const event = await latestAuditEvent(testApp.deps.db, 'work-order.created', workOrder.id);
    expect(event).toMatchObject({ actorId: technician.person.id, details: { number: workOrder.number, organisationId: orgA.id } });
  });

  it('numbers two orders created at the same moment differently, one after the other', async () => {
    const body = { organisationId: orgB.id, title: `Parallel ${uniqueSuffix()}`, decisionRule: 'simple' };
    const [first, second] = await Promise.all([
      sendJson(technician, 'post', '/api/work-orders', body),
      sendJson(technician, 'post', '/api/work-orders', body),
    ]);
    expect([first.status, second.status]).toEqual([201, 201]);
    const serials = [first.body.workOrder.number, second.body.workOrder.number].map((n: string) => Number(n.split('-')[2])).sort((a, b) => a - b);
    expect(serials[1] - serials[0]).toBeGreaterThanOrEqual(1);
  });

  it('answers bad fields with a sentence per field', async () => {
    const response = await sendJson(technician, 'post', '/api/work-orders', {
      organisationId: 'not-an-id',
      title: '   ',
      dueDate: '2026-02-30',
      decisionRule: 'lenient',
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({
      organisationId: 'Field "organisationId" must be an id (a UUID).',
      title: 'Field "title" must not be empty.',
      dueDate: 'Field "dueDate" must be a real date written YYYY-MM-DD (e.g. 2026-03-31).',
      decisionRule: 'Field "decisionRule" must be "simple" or "guarded".',
    });

    const wrongFormat = await sendJson(technician, 'post', '/api/work-orders', {
      organisationId: orgA.id,
      title: 'Dates',
      dueDate: '30/09/2026',
      decisionRule: 'simple',
    });
    expect(wrongFormat.body.error.fields).toEqual({ dueDate: 'Field "dueDate" must be a real date written YYYY-MM-DD (e.g. 2026-03-31).' });
  });

  it('refuses an unknown organisation and the lab itself, naming organisationId', async () => {
    const unknown = await sendJson(technician, 'post', '/api/work-orders', {
      organisationId: '00000000-0000-4000-8000-000000000000',
      title: 'Nobody',
      decisionRule: 'simple',
    });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.fields.organisationId).toBe('Field "organisationId" names no organisation (00000000-0000-4000-8000-000000000000).');

    const ownLab = await sendJson(technician, 'post', '/api/work-orders', { organisationId: lab.id, title: 'Internal', decisionRule: 'simple' });
    expect(ownLab.status).toBe(400);
    expect(ownLab.body.error.fields.organisationId).toBe(`Field "organisationId" must name a client organisation; "${lab.name}" is the lab itself.`);
  });
});

describe('GET and PATCH /api/work-orders/:workOrderId', () => {
  it('returns the order with its lenses, lens count and measurement count', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id, createdById: technician.person.id });
    const lensB = await insertLens(testApp.deps.db, { workOrderId: order.id, identifier: 'SN-B', nominalFocalLengthMm: -40, toleranceMm: 0.4, tolerancePercent: null });
    const lensA = await insertLens(testApp.deps.db, { workOrderId: order.id, identifier: 'SN-A', partNumber: 'PX-1' });
    await insertMeasurement(testApp.deps.db, { lensId: lensA.id });
    await insertMeasurement(testApp.deps.db, { lensId: lensA.id, result: { focalLengthMm: 100.2, expandedUncertaintyMm: 0.3, decision: 'conforms' } });

    const response = await reviewer.agent.get(`/api/work-orders/${order.id}`);
    expect(response.status).toBe(200);
    const { workOrder } = response.body;
    expect(workOrder).toMatchObject({ id: order.id, number: order.number, lensCount: 2, measurementCount: 2 });
    expect(workOrder.lenses.map((l: { identifier: string }) => l.identifier)).toEqual(['SN-A', 'SN-B']);
    expect(workOrder.lenses[1]).toEqual({
      id: lensB.id,
      identifier: 'SN-B',
      description: '',
      partNumber: null,
      nominalFocalLengthMm: -40,
      nominalPowerDioptres: -25,
      tolerancePercent: null,
      toleranceMm: 0.4,
      kind: 'diverging',
      latestMeasurement: null,
    });
    expect(workOrder.lenses[0].latestMeasurement).toMatchObject({ focalLengthMm: 100.2, expandedUncertaintyMm: 0.3, decision: 'conforms', status: 'analysed' });
  });

  it('changes status, due date and client reference, and records what changed', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id, clientReference: 'OLD-1', dueDate: '2026-05-01' });
    const response = await sendJson(technician, 'patch', `/api/work-orders/${order.id}`, {
      status: 'in-progress',
      dueDate: '2026-06-15',
      clientReference: '',
    });
    expect(response.status).toBe(200);
    expect(response.body.workOrder).toMatchObject({ status: 'in-progress', dueDate: '2026-06-15', clientReference: null });
    const event = await latestAuditEvent(testApp.deps.db, 'work-order.updated', order.id);
    expect(event.details).toMatchObject({
      changedFields: ['clientReference', 'dueDate', 'status'],
      before: { status: 'open', dueDate: '2026-05-01', clientReference: 'OLD-1' },
      after: { status: 'in-progress', dueDate: '2026-06-15', clientReference: null },
    });
  });

  it('answers an empty change, a bad status and an unknown id with sentences', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const empty = await sendJson(technician, 'patch', `/api/work-orders/${order.id}`, {});
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('Send at least one of the fields title, clientReference, dueDate, decisionRule, notes, status.');

    const badStatus = await sendJson(technician, 'patch', `/api/work-orders/${order.id}`, { status: 'done' });
    expect(badStatus.body.error.fields).toEqual({
      status: 'Field "status" must be one of: requested, open, in-progress, completed, cancelled.',
    });

    const unknownId = '00000000-0000-4000-8000-000000000000';
    const missing = await sendJson(technician, 'patch', `/api/work-orders/${unknownId}`, { title: 'x' });
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toBe(`There is no work order with id ${unknownId}.`);

    const malformed = await technician.agent.get('/api/work-orders/12345');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.fields).toEqual({ workOrderId: 'Field "workOrderId" must be an id (a UUID).' });
  });
});

describe('GET /api/work-orders (search, filters, sorting, pages)', () => {
  let prefix: string;
  let made: Awaited<ReturnType<typeof insertWorkOrder>>[];

  beforeAll(async () => {
    prefix = `Qz${uniqueSuffix()}`;
    const db = testApp.deps.db;
    const rows = [
      { title: `${prefix} alpha`, organisationId: orgA.id, status: 'open', dueDate: '2026-04-10', clientReference: `${prefix}-REF-7` },
      { title: `${prefix} bravo`, organisationId: orgA.id, status: 'in-progress', dueDate: '2026-04-01' },
      { title: `${prefix} charlie 100% check`, organisationId: orgB.id, status: 'completed', dueDate: '2026-05-20' },
      { title: `${prefix} delta`, organisationId: orgB.id, status: 'requested', dueDate: null },
      { title: `${prefix} echo under_score`, organisationId: orgA.id, status: 'cancelled', dueDate: '2026-04-30' },
      { title: `${prefix} foxtrot O'Brien'; DROP TABLE work_orders; --`, organisationId: orgB.id, status: 'open', dueDate: '2026-04-15' },
      { title: `${prefix} golf`, organisationId: orgA.id, status: 'open', dueDate: '2026-06-01' },
    ] as const;
    made = [];
    for (const [index, row] of rows.entries()) {
      made.push(
        await insertWorkOrder(db, {
          ...row,
          number: `WO-T${prefix}-${String(index + 1).padStart(2, '0')}`,
          createdAt: new Date(Date.UTC(2026, 0, 1 + index)),
        }),
      );
    }
    await insertLens(db, { workOrderId: made[3].id, identifier: `${prefix}-LENS-SN-42`, partNumber: `${prefix}-PN` });
  });

  async function list(session: SignedInSession, params: Record<string, string | number>) {
    const response = await session.agent.get('/api/work-orders').query({ q: prefix, ...params });
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    return response.body as { items: WorkOrderListItem[]; total: number; page: number; pageSize: number };
  }

  it('finds every order by a title prefix, newest first by default, with total', async () => {
    const body = await list(technician, {});
    expect(body.total).toBe(7);
    expect(body.page).toBe(1);
    expect(body.pageSize).toBe(25);
    expect(ids(body.items)).toEqual(ids([...made].reverse()));
  });

  it('pages through the results without overlap or gaps', async () => {
    const pages = [];
    for (const page of [1, 2, 3]) pages.push(await list(technician, { sort: 'number', order: 'asc', page, pageSize: 3 }));
    expect(pages.map((p) => p.items.length)).toEqual([3, 3, 1]);
    expect(pages.every((p) => p.total === 7)).toBe(true);
    expect(pages.flatMap((p) => ids(p.items))).toEqual(ids(made));
    const beyond = await list(technician, { page: 4, pageSize: 3 });
    expect(beyond).toMatchObject({ items: [], total: 7, page: 4 });
  });

  it('sorts by due date (missing dates last), status (in the order of the work), organisation and number', async () => {
    const byDue = await list(technician, { sort: 'dueDate', order: 'asc' });
    expect(byDue.items.map((i) => i.dueDate)).toEqual(['2026-04-01', '2026-04-10', '2026-04-15', '2026-04-30', '2026-05-20', '2026-06-01', null]);
    const byDueDesc = await list(technician, { sort: 'dueDate', order: 'desc' });
    expect(byDueDesc.items.map((i) => i.dueDate)).toEqual(['2026-06-01', '2026-05-20', '2026-04-30', '2026-04-15', '2026-04-10', '2026-04-01', null]);

    const byStatus = await list(technician, { sort: 'status' });
    expect(byStatus.items.map((i) => i.status)).toEqual(['requested', 'open', 'open', 'open', 'in-progress', 'completed', 'cancelled']);

    const byOrganisation = await list(technician, { sort: 'organisation', order: 'desc' });
    expect(byOrganisation.items.map((i) => i.organisation.name)).toEqual([...Array(3).fill(orgB.name), ...Array(4).fill(orgA.name)]);

    const byNumberDesc = await list(technician, { sort: 'number', order: 'desc' });
    expect(ids(byNumberDesc.items)).toEqual(ids([...made].reverse()));
  });

  it('filters by status (one or several), organisation and an inclusive due-date range', async () => {
    expect(ids((await list(technician, { status: 'open' })).items).sort()).toEqual(ids([made[0], made[5], made[6]]).sort());
    expect(ids((await list(technician, { status: 'requested,completed' })).items).sort()).toEqual(ids([made[2], made[3]]).sort());
    expect((await list(technician, { organisationId: orgB.id })).total).toBe(3);
    const april = await list(technician, { dueAfter: '2026-04-10', dueBefore: '2026-04-30', sort: 'dueDate' });
    expect(april.items.map((i) => i.dueDate)).toEqual(['2026-04-10', '2026-04-15', '2026-04-30']);
  });

  it('searches client reference, organisation name, lens identifier and part number', async () => {
    const byReference = await technician.agent.get('/api/work-orders').query({ q: `${prefix}-ref-7` });
    expect(ids(byReference.body.items)).toEqual([made[0].id]);
    const byLens = await technician.agent.get('/api/work-orders').query({ q: `${prefix}-LENS-SN` });
    expect(ids(byLens.body.items)).toEqual([made[3].id]);
    const byPartNumber = await technician.agent.get('/api/work-orders').query({ q: `${prefix}-pn` });
    expect(ids(byPartNumber.body.items)).toEqual([made[3].id]);
    const byOrganisation = await technician.agent.get('/api/work-orders').query({ q: orgB.name, pageSize: 100 });
    expect(byOrganisation.body.items.every((i: WorkOrderListItem) => i.organisation.id === orgB.id)).toBe(true);
    expect(ids(byOrganisation.body.items)).toEqual(expect.arrayContaining(ids([made[2], made[3], made[5]])));
  });

  it('takes %, _ and SQL-looking text in q literally', async () => {
    const percent = await technician.agent.get('/api/work-orders').query({ q: `${prefix} charlie 100%` });
    expect(ids(percent.body.items)).toEqual([made[2].id]);
    const wildcardOnly = await technician.agent.get('/api/work-orders').query({ q: `${prefix}%echo` });
    expect(wildcardOnly.body.total).toBe(0);
    const underscore = await technician.agent.get('/api/work-orders').query({ q: `${prefix} echo under_` });
    expect(ids(underscore.body.items)).toEqual([made[4].id]);
    const underscoreAsWildcard = await technician.agent.get('/api/work-orders').query({ q: `${prefix} echo underXscore` });
    expect(underscoreAsWildcard.body.total).toBe(0);

    const injection = await technician.agent.get('/api/work-orders').query({ q: `O'Brien'; DROP TABLE work_orders; --` });
    expect(injection.status).toBe(200);
    expect(ids(injection.body.items)).toContain(made[5].id);
    const orTrue = await technician.agent.get('/api/work-orders').query({ q: `${prefix}' OR '1'='1` });
    expect(orTrue.body.total).toBe(0);
    const [{ count }] = (await testApp.deps.db.execute(sql`select count(*)::int as count from work_orders`)).rows as { count: number }[];
    expect(count).toBeGreaterThanOrEqual(7);
  });

  it('answers bad list parameters with a sentence per field', async () => {
    const response = await technician.agent.get('/api/work-orders').query({ page: 0, pageSize: 101, sort: 'title', order: 'up', dueAfter: '2026-2-1' });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({
      page: 'Field "page" must be a whole number, 1 or more.',
      pageSize: 'Field "pageSize" must be a whole number from 1 to 100.',
      sort: 'Field "sort" must be one of: number, dueDate, createdAt, status, organisation.',
      order: 'Field "order" must be "asc" or "desc".',
      dueAfter: 'Field "dueAfter" must be a real date written YYYY-MM-DD (e.g. 2026-03-31).',
    });
    const status = await technician.agent.get('/api/work-orders').query({ status: 'open,finished' });
    expect(status.body.error.fields).toEqual({
      status: 'Field "status" must be one or more of: requested, open, in-progress, completed, cancelled (comma-separated).',
    });
  });

  it('shows a client only their own organisation\'s orders, whatever filter they send', async () => {
    const own = await list(clientA, {});
    expect(own.total).toBe(4);
    expect(own.items.every((item) => item.organisation.id === orgA.id)).toBe(true);
    const probing = await list(clientA, { organisationId: orgB.id });
    expect(probing).toMatchObject({ items: [], total: 0 });
    const other = await list(clientB, {});
    expect(ids(other.items).sort()).toEqual(ids([made[2], made[3], made[5]]).sort());
  });

  it('answers a client asking for another organisation\'s order exactly as for an unknown id', async () => {
    const foreign = await clientA.agent.get(`/api/work-orders/${made[3].id}`);
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual({ error: { message: `There is no work order with id ${made[3].id}.` } });
    const own = await clientA.agent.get(`/api/work-orders/${made[0].id}`);
    expect(own.status).toBe(200);
    expect(own.body.workOrder.id).toBe(made[0].id);
  });

  it('shows a client account without an organisation no orders at all', async () => {
    const orphan = await signedInWithRoles(testApp, ['client']);
    const response = await orphan.agent.get('/api/work-orders').query({ q: prefix });
    expect(response.body).toMatchObject({ items: [], total: 0 });
    expect((await orphan.agent.get(`/api/work-orders/${made[0].id}`)).status).toBe(404);
  });
});

describe('GET /api/organisations', () => {
  it('lists organisations by name and filters by kind', async () => {
    const all = await technician.agent.get('/api/organisations');
    expect(all.status).toBe(200);
    expect(all.body.items).toEqual(expect.arrayContaining([{ id: orgA.id, name: orgA.name, kind: 'client' }, { id: lab.id, name: lab.name, kind: 'lab' }]));
    const names = all.body.items.map((o: { name: string }) => o.name);
    expect(names).toEqual([...names].sort((a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0)));

    const clients = await technician.agent.get('/api/organisations?kind=client');
    expect(clients.body.items.every((o: { kind: string }) => o.kind === 'client')).toBe(true);
    expect(ids(clients.body.items)).toContain(orgB.id);
    expect(ids(clients.body.items)).not.toContain(lab.id);

    const bad = await technician.agent.get('/api/organisations?kind=supplier');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({ kind: 'Field "kind" must be "client" or "lab".' });
  });
});
