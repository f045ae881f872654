import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, lenses, outboundMail, workOrders } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, createTestPerson } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { insertCertifiedLens, type CertifiedLens } from '../verification/issued-certificate-fixture';

let testApp: TestApp;
let ownClient: SignedInSession;
let otherClient: SignedInSession;
let own: { id: string; name: string };
let other: { id: string; name: string };
let certified: CertifiedLens;
let othersCertified: CertifiedLens;
let labReviewerEmail: string;

beforeAll(async () => {
  testApp = createTestApp();
  own = await createTestOrganisation(testApp.deps, { kind: 'client' });
  other = await createTestOrganisation(testApp.deps, { kind: 'client' });
  const lab = await createTestOrganisation(testApp.deps, { kind: 'lab' });
  labReviewerEmail = (await createTestPerson(testApp.deps, { roles: ['reviewer'], organisationId: lab.id })).email;
  ownClient = await signedInWithRoles(testApp, ['client'], { organisationId: own.id });
  otherClient = await signedInWithRoles(testApp, ['client'], { organisationId: other.id });
  certified = await insertCertifiedLens(testApp.deps, { organisationId: own.id, organisationName: own.name, revisionCount: 2 });
  // A second lens on the same order, still under review, and one still on the bench.
  await insertCertifiedLens(testApp.deps, { organisationId: own.id, organisationName: own.name, revisionCount: 0, measurementStatus: 'approved', workOrderId: certified.workOrderId });
  await insertCertifiedLens(testApp.deps, { organisationId: own.id, organisationName: own.name, revisionCount: 0, measurementStatus: 'returned', workOrderId: certified.workOrderId });
  othersCertified = await insertCertifiedLens(testApp.deps, { organisationId: other.id, organisationName: other.name });
}, 60_000);

afterAll(async () => {
  await testApp?.close();
});

describe('GET /api/portal/orders', () => {
  it("lists the client's own work order with each lens's stage, the current certificate's result and every revision", async () => {
    const response = await ownClient.agent.get('/api/portal/orders');
    expect(response.status).toBe(200);
    expect(response.body.organisation).toEqual({ id: own.id, name: own.name });
    const order = response.body.items.find((item: { id: string }) => item.id === certified.workOrderId);
    expect(order).toBeDefined();
    expect(order.lenses).toHaveLength(3);
    const stages = order.lenses.map((lens: { measurements: { stage: string }[] }) => lens.measurements[0].stage).sort();
    expect(stages).toEqual(['being-measured', 'certified', 'in-review']);

    const lens = order.lenses.find((item: { id: string }) => item.id === certified.lensId);
    const [measurement] = lens.measurements;
    const current = certified.revisions[1];
    expect(measurement.result).toEqual({
      focalLengthMm: current.data.results.focalLengthMm,
      expandedUncertaintyMm: current.data.results.expandedUncertaintyMm,
      coverageFactor: current.data.results.coverageFactor,
      decision: current.data.conformity.decision,
    });
    expect(measurement.certificates.map((c: { revision: number; status: string; downloadUrl: string }) => [c.revision, c.status, c.downloadUrl])).toEqual([
      [2, 'current', `/api/certificates/${certified.revisions[1].id}/pdf`],
      [1, 'superseded', `/api/certificates/${certified.revisions[0].id}/pdf`],
    ]);
    // Unfinished work carries no numbers.
    for (const other of order.lenses.filter((item: { id: string }) => item.id !== certified.lensId)) {
      expect(other.measurements[0].result).toBeNull();
    }
  });

  it("never shows another organisation's orders, lenses or certificates", async () => {
    const response = await ownClient.agent.get('/api/portal/orders?pageSize=50');
    const text = JSON.stringify(response.body);
    expect(text).not.toContain(othersCertified.workOrderId);
    expect(text).not.toContain(othersCertified.lensIdentifier);
    expect(text).not.toContain(othersCertified.revisions[0].id);
    expect(text).not.toContain(other.name);
    const theirs = await otherClient.agent.get('/api/portal/orders');
    expect(JSON.stringify(theirs.body)).not.toContain(certified.workOrderId);
    expect(theirs.body.items.map((item: { id: string }) => item.id)).toEqual([othersCertified.workOrderId]);
  });

  it('filters by status and searches lens identifiers', async () => {
    const byLens = await ownClient.agent.get(`/api/portal/orders?q=${certified.lensIdentifier.toLowerCase()}`);
    expect(byLens.body.items.map((item: { id: string }) => item.id)).toEqual([certified.workOrderId]);
    const completedOnly = await ownClient.agent.get('/api/portal/orders?status=completed');
    expect(completedOnly.body.items).toEqual([]);
    const bad = await ownClient.agent.get('/api/portal/orders?status=finished');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.status).toContain('Field "status" must be one or more of');
  });

  it('is refused to staff (403) and to anonymous visitors (401)', async () => {
    const technician = await signedInWithRoles(testApp, ['technician']);
    expect((await technician.agent.get('/api/portal/orders')).status).toBe(403);
    const { default: request } = await import('supertest');
    expect((await request(testApp.app).get('/api/portal/orders')).status).toBe(401);
  });
});

describe('POST /api/portal/work-requests', () => {
  const validLens = (identifier: string) => ({ identifier, description: 'Biconvex singlet', nominalFocalLengthMm: 50, tolerancePercent: 2, partNumber: 'BCX-50' });

  it("creates a 'requested' work order for the client's organisation with its lenses, an audit event and the lab's e-mail", async () => {
    const response = await ownClient.agent
      .post('/api/portal/work-requests')
      .set(CSRF_HEADER_NAME, ownClient.csrfToken)
      .send({
        title: 'Spring batch of eyepiece lenses',
        clientReference: 'PO-7781',
        dueDate: '2099-05-01',
        notes: 'Please measure <both> sides & report BFD.',
        lenses: [validLens('EP-1'), { identifier: 'EP-2', nominalFocalLengthMm: -75, toleranceMm: 0.5 }],
      });
    expect(response.status).toBe(201);
    const { workOrder } = response.body;
    expect(workOrder).toMatchObject({ status: 'requested', title: 'Spring batch of eyepiece lenses', lensCount: 2, decisionRule: 'simple' });
    expect(workOrder.number).toMatch(/^WO-\d{4}-\d{4,}$/);

    const [row] = await testApp.deps.db.select().from(workOrders).where(eq(workOrders.id, workOrder.id));
    expect(row).toMatchObject({ organisationId: own.id, status: 'requested', clientReference: 'PO-7781', dueDate: '2099-05-01', createdById: ownClient.person.id });
    const lensRows = await testApp.deps.db.select().from(lenses).where(eq(lenses.workOrderId, workOrder.id));
    expect(lensRows.map((lens) => [lens.identifier, lens.nominalFocalLengthMm, lens.tolerancePercent, lens.toleranceMm]).sort()).toEqual([
      ['EP-1', 50, 2, null],
      ['EP-2', -75, null, 0.5],
    ]);
    const events = await testApp.deps.db.select().from(auditEvents).where(and(eq(auditEvents.subjectId, workOrder.id), eq(auditEvents.action, 'work-order.requested')));
    expect(events).toHaveLength(1);
    expect(events[0].actorId).toBe(ownClient.person.id);

    const [mail] = await testApp.deps.db.select().from(outboundMail).where(and(eq(outboundMail.subjectType, 'work-order'), eq(outboundMail.subjectId, workOrder.id)));
    expect(mail.kind).toBe('work-requested');
    expect(mail.status).toBe('queued');
    expect(mail.toAddresses).toContain(labReviewerEmail);
    expect(mail.toAddresses).not.toContain(ownClient.person.email);
    expect(mail.subject).toContain(workOrder.number);
    expect(mail.htmlBody).toContain('Please measure &lt;both&gt; sides &amp; report BFD.');
    expect(mail.textBody).toContain('Please measure <both> sides & report BFD.');
  });

  it('names the lens field at fault as lenses[i].field and writes nothing', async () => {
    const title = `Rejected request ${Date.now()}`;
    const response = await ownClient.agent
      .post('/api/portal/work-requests')
      .set(CSRF_HEADER_NAME, ownClient.csrfToken)
      .send({ title, lenses: [validLens('A-1'), validLens('A-2'), { identifier: 'A-3', nominalFocalLengthMm: 'fifty', tolerancePercent: 1 }] });
    expect(response.status).toBe(400);
    expect(response.body.error.fields['lenses[2].nominalFocalLengthMm']).toBe('Field "lenses[2].nominalFocalLengthMm" must be a number (mm).');
    expect(response.body.error.message).toBe('Some fields need attention: lenses[2].nominalFocalLengthMm.');
    const written = await testApp.deps.db.select().from(workOrders).where(eq(workOrders.title, title));
    expect(written).toEqual([]);
  });

  it('refuses a lens without a tolerance, a repeated identifier, no lenses, more than 50 and a past due date, each naming its field', async () => {
    const post = (body: object) => ownClient.agent.post('/api/portal/work-requests').set(CSRF_HEADER_NAME, ownClient.csrfToken).send(body);
    const noTolerance = await post({ title: 'x', lenses: [{ identifier: 'B-1', nominalFocalLengthMm: 40 }] });
    expect(noTolerance.status).toBe(400);
    expect(noTolerance.body.error.fields['lenses[0].tolerancePercent']).toMatch(/^Lens 1 \(lenses\[0\]\): Give a tolerance/);

    const repeated = await post({ title: 'x', lenses: [validLens('C-1'), validLens('c-1')] });
    expect(repeated.body.error.fields['lenses[1].identifier']).toBe('Field "lenses[1].identifier" repeats the identifier "c-1" of lens 1; each lens needs its own.');

    const none = await post({ title: 'x', lenses: [] });
    expect(none.body.error.fields.lenses).toBe('Field "lenses" must list at least one lens to measure.');

    const tooMany = await post({ title: 'x', lenses: Array.from({ length: 51 }, (_, i) => validLens(`D-${i}`)) });
    expect(tooMany.body.error.fields.lenses).toContain('at most 50 lenses');

    const past = await post({ title: 'x', dueDate: '2001-01-01', lenses: [validLens('E-1')] });
    expect(past.status).toBe(400);
    expect(past.body.error.fields.dueDate).toMatch(/^Field "dueDate" must not be in the past/);
  });

  it('is refused to a technician (403)', async () => {
    const technician = await signedInWithRoles(testApp, ['technician']);
    const response = await technician.agent.post('/api/portal/work-requests').set(CSRF_HEADER_NAME, technician.csrfToken).send({ title: 'x', lenses: [validLens('F-1')] });
    expect(response.status).toBe(403);
  });
});

describe('a client account without an organisation', () => {
  it('sees an empty list and cannot request work (409 with a sentence)', async () => {
    const loose = await signedInWithRoles(testApp, ['client'], { organisationId: null });
    const list = await loose.agent.get('/api/portal/orders');
    expect(list.status).toBe(200);
    expect(list.body).toMatchObject({ organisation: null, items: [], total: 0 });
    const post = await loose.agent
      .post('/api/portal/work-requests')
      .set(CSRF_HEADER_NAME, loose.csrfToken)
      .send({ title: 'x', lenses: [{ identifier: 'G-1', nominalFocalLengthMm: 10, tolerancePercent: 1 }] });
    expect(post.status).toBe(409);
    expect(post.body.error.message).toBe('Your account belongs to no client organisation; ask the laboratory to add you to one.');
  });
});
