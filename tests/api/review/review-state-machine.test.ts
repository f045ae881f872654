/**
 * The review state machine through the API: every (state × action × role)
 * with its expected status, the four-eyes rule, the audit trail and the
 * thread, and read-only certified measurements.
 */
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, auditEvents, certificates, measurements, reviewEntries, workOrders, type MeasurementStatus } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { signInAs, signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestPerson } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestLens, createTestWorkOrder } from '../measurements/bench-records';
import { createReviewBench, measurementStatusOf, stageMeasurement, type ReviewBench } from './review-bench';

let testApp: TestApp;
let bench: ReviewBench;
let performer: SignedInSession;
let sessions: Record<'technician' | 'reviewer' | 'admin' | 'client', SignedInSession>;
let otherReviewerId: string;

beforeAll(async () => {
  testApp = createTestApp({ env: { LOG_LEVEL: process.env.REVIEW_DEBUG ? "error" : "silent" } });
  bench = await createReviewBench(testApp);
  performer = await signedInWithRoles(testApp, ['technician']);
  sessions = {
    technician: await signedInWithRoles(testApp, ['technician']),
    reviewer: await signedInWithRoles(testApp, ['reviewer']),
    admin: await signedInWithRoles(testApp, ['admin']),
    client: await signedInWithRoles(testApp, ['client'], { organisationId: bench.organisation.id }),
  };
  otherReviewerId = (await createTestPerson(testApp.deps, { roles: ['reviewer'] })).id;
}, 120_000);

afterAll(async () => {
  await testApp?.close();
});

function post(session: SignedInSession, path: string, body: object = {}) {
  return session.agent.post(path).set(CSRF_HEADER_NAME, session.csrfToken).send(body);
}

const actions = {
  submit: { path: (id: string) => `/api/measurements/${id}/submission`, body: {}, roles: ['technician'], from: ['analysed', 'returned'], to: 'submitted', ok: 200 },
  approve: { path: (id: string) => `/api/measurements/${id}/approval`, body: {}, roles: ['reviewer', 'admin'], from: ['submitted'], to: 'approved', ok: 200 },
  return: {
    path: (id: string) => `/api/measurements/${id}/return`,
    body: { comment: 'The humidity reading looks swapped with the temperature; please check.' },
    roles: ['reviewer', 'admin'],
    from: ['submitted'],
    to: 'returned',
    ok: 200,
  },
  issue: { path: (id: string) => `/api/measurements/${id}/certificates`, body: {}, roles: ['reviewer', 'admin'], from: ['approved'], to: 'certified', ok: 201 },
} as const;

const states: MeasurementStatus[] = ['draft', 'analysing', 'analysed', 'analysis-failed', 'submitted', 'approved', 'returned', 'certified'];
const roles = ['technician', 'reviewer', 'admin', 'client'] as const;

const table = Object.entries(actions).flatMap(([action, spec]) =>
  states.flatMap((state) =>
    roles.map((role) => {
      const roleAllowed = (spec.roles as readonly string[]).includes(role);
      const stateAllowed = (spec.from as readonly string[]).includes(state);
      const expected = !roleAllowed ? 403 : stateAllowed ? spec.ok : 409;
      return { action: action as keyof typeof actions, state, role, expected };
    }),
  ),
);

describe('the review state machine, every state × action × role', () => {
  it.each(table)('$action from $state by a $role answers $expected', async ({ action, state, role, expected }) => {
    const spec = actions[action];
    const staged = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: state, approvedById: otherReviewerId });
    const response = await post(sessions[role], spec.path(staged.id), spec.body);
    expect(response.status, JSON.stringify(response.body)).toBe(expected);
    const after = await measurementStatusOf(testApp, staged.id);
    if (expected === spec.ok) {
      expect(after).toBe(spec.to);
    } else {
      expect(after).toBe(state);
      expect(response.body.error.message).toMatch(/\.$/);
      if (expected === 409) expect(response.body.error.message).toContain(`status ${state}`);
    }
  }, 30_000);
});

describe('the four-eyes rule', () => {
  it('refuses approval (403) by the person who performed the measurement, even holding the reviewer role', async () => {
    const both = await createTestPerson(testApp.deps, { roles: ['technician', 'reviewer'] });
    const session = await signInAs(testApp.app, both);
    const staged = await stageMeasurement(testApp, bench, { performedById: both.id, status: 'analysed' });
    expect((await post(session, actions.submit.path(staged.id))).status).toBe(200);
    const refused = await post(session, actions.approve.path(staged.id));
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe(`You performed measurement ${staged.number}, so you cannot approve it: another reviewer must (four-eyes rule).`);
    expect(await measurementStatusOf(testApp, staged.id)).toBe('submitted');
  });

  it('refuses approval (403) by the person who submitted it for someone else', async () => {
    const both = await createTestPerson(testApp.deps, { roles: ['technician', 'reviewer'] });
    const session = await signInAs(testApp.app, both);
    const staged = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'analysed' });
    expect((await post(session, actions.submit.path(staged.id))).status).toBe(200);
    const refused = await post(session, actions.approve.path(staged.id));
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toContain('You submitted measurement');
  });

  it('refuses issuing the certificate (403) by the performer holding the reviewer role, and no certificate row is written', async () => {
    const both = await createTestPerson(testApp.deps, { roles: ['technician', 'reviewer'] });
    const session = await signInAs(testApp.app, both);
    const staged = await stageMeasurement(testApp, bench, { performedById: both.id, submittedById: performer.person.id, status: 'approved', approvedById: otherReviewerId });
    const refused = await post(session, actions.issue.path(staged.id));
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toContain('four-eyes rule');
    expect(await testApp.deps.db.select().from(certificates).where(eq(certificates.measurementId, staged.id))).toHaveLength(0);
    expect(await measurementStatusOf(testApp, staged.id)).toBe('approved');
  });
});

describe('transitions leave a record', () => {
  it('submit, return, resubmit, approve and issue each write one audit event by their actor and a thread entry, with the review fields filled', async () => {
    const staged = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'analysed' });
    expect((await post(performer, actions.submit.path(staged.id), { remark: 'Ready for a look.' })).status).toBe(200);
    expect((await post(sessions.reviewer, actions.return.path(staged.id), { comment: 'Frame 3 looks saturated; exclude it?' })).status).toBe(200);
    expect((await post(performer, actions.submit.path(staged.id))).status).toBe(200);
    const approved = await post(sessions.reviewer, actions.approve.path(staged.id));
    expect(approved.status).toBe(200);
    expect(approved.body.measurement.review.submittedBy).toEqual({ id: performer.person.id, name: performer.person.name });
    expect(approved.body.measurement.review.approvedBy).toEqual({ id: sessions.reviewer.person.id, name: sessions.reviewer.person.name });
    expect((await post(sessions.admin, actions.issue.path(staged.id))).status).toBe(201);

    const events = await testApp.deps.db.select().from(auditEvents).where(and(eq(auditEvents.subjectType, 'measurement'), eq(auditEvents.subjectId, staged.id)));
    const byAction = (action: string) => events.filter((e) => e.action === action).map((e) => e.actorId);
    expect(byAction('measurement.submitted')).toEqual([performer.person.id, performer.person.id]);
    expect(byAction('measurement.returned')).toEqual([sessions.reviewer.person.id]);
    expect(byAction('measurement.approved')).toEqual([sessions.reviewer.person.id]);
    expect(byAction('measurement.certified')).toEqual([sessions.admin.person.id]);
    const [certificate] = await testApp.deps.db.select().from(certificates).where(eq(certificates.measurementId, staged.id));
    const issued = await testApp.deps.db.select().from(auditEvents).where(and(eq(auditEvents.action, 'certificate.issued'), eq(auditEvents.subjectId, certificate.id)));
    expect(issued.map((e) => e.actorId)).toEqual([sessions.admin.person.id]);

    const thread = await sessions.technician.agent.get(`/api/measurements/${staged.id}/review-entries`);
    expect(thread.status).toBe(200);
    expect(thread.body.entries.map((e: { kind: string }) => e.kind)).toEqual(['submission', 'return', 'submission', 'approval']);
    expect(thread.body.entries[0].body).toBe('Ready for a look.');
    expect(thread.body.entries[1]).toMatchObject({ body: 'Frame 3 looks saturated; exclude it?', author: { id: sessions.reviewer.person.id, roles: ['reviewer'] }, analysisVersion: 1 });

    const [row] = await testApp.deps.db.select().from(measurements).where(eq(measurements.id, staged.id));
    expect(row).toMatchObject({ status: 'certified', submittedById: performer.person.id, approvedById: sessions.reviewer.person.id });
    expect(row.submittedAt).toBeInstanceOf(Date);
    expect(row.approvedAt).toBeInstanceOf(Date);
  }, 60_000);

  it('a return without a comment is refused with 400 naming the field, and nothing changes', async () => {
    const staged = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'submitted' });
    const refused = await post(sessions.reviewer, actions.return.path(staged.id), { comment: '   ' });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.comment).toContain('never returned without a reason');
    expect(await measurementStatusOf(testApp, staged.id)).toBe('submitted');
    expect(await testApp.deps.db.select().from(reviewEntries).where(eq(reviewEntries.measurementId, staged.id))).toHaveLength(0);
  });

  it('submission is refused (409) while temperature or humidity is not recorded', async () => {
    const staged = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'analysed' });
    await testApp.deps.db.update(measurements).set({ relativeHumidityPercent: null }).where(eq(measurements.id, staged.id));
    const refused = await post(performer, actions.submit.path(staged.id));
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toContain('relative humidity');
  });

  it('lab roles comment on the thread; a client may not read or write it (403)', async () => {
    const staged = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'certified' });
    const added = await post(sessions.technician, `/api/measurements/${staged.id}/review-entries`, { body: 'Lens cleaned before the second sweep.' });
    expect(added.status).toBe(201);
    expect(added.body.entry).toMatchObject({ kind: 'comment', body: 'Lens cleaned before the second sweep.', author: { id: sessions.technician.person.id } });
    expect((await post(sessions.client, `/api/measurements/${staged.id}/review-entries`, { body: 'hello' })).status).toBe(403);
    expect((await sessions.client.agent.get(`/api/measurements/${staged.id}/review-entries`)).status).toBe(403);
    expect((await post(sessions.reviewer, `/api/measurements/${staged.id}/review-entries`, { body: '' })).status).toBe(400);
  });
});

describe('submission checks the analysis against the lens as it is now', () => {
  async function stagedOnOwnLens(workOrder = bench.workOrder) {
    // A lens of its own with the analysed specification, so editing it leaves other staged measurements alone.
    const lens = await createTestLens(testApp.deps, workOrder.id, { nominalFocalLengthMm: bench.lens.nominalFocalLengthMm, tolerancePercent: bench.lens.tolerancePercent });
    const staged = await stageMeasurement(testApp, { ...bench, lens }, { performedById: performer.person.id, status: 'analysed' });
    return { lens, staged };
  }

  async function expectRefusedAndUnchanged(staged: Awaited<ReturnType<typeof stageMeasurement>>, message: string) {
    const refused = await post(performer, actions.submit.path(staged.id));
    expect(refused.status, JSON.stringify(refused.body)).toBe(409);
    expect(refused.body.error.message).toBe(message);
    expect(await measurementStatusOf(testApp, staged.id)).toBe('analysed');
    expect(await testApp.deps.db.select().from(reviewEntries).where(eq(reviewEntries.measurementId, staged.id))).toHaveLength(0);
  }

  it('is refused (409) when the nominal focal length changed after the analysis, and nothing is written', async () => {
    const { lens, staged } = await stagedOnOwnLens();
    const edited = await sessions.technician.agent
      .patch(`/api/lenses/${lens.id}`)
      .set(CSRF_HEADER_NAME, sessions.technician.csrfToken)
      .send({ nominalFocalLengthMm: lens.nominalFocalLengthMm + 5 });
    expect(edited.status, JSON.stringify(edited.body)).toBeLessThan(300);
    await expectRefusedAndUnchanged(staged, "The lens's nominal focal length or tolerance changed after analysis v1; run the analysis again before submitting.");
  });

  it('is refused (409) when the tolerance changed after the analysis', async () => {
    const { lens, staged } = await stagedOnOwnLens();
    const edited = await sessions.technician.agent.patch(`/api/lenses/${lens.id}`).set(CSRF_HEADER_NAME, sessions.technician.csrfToken).send({ tolerancePercent: 5 });
    expect(edited.status, JSON.stringify(edited.body)).toBeLessThan(300);
    await expectRefusedAndUnchanged(staged, "The lens's nominal focal length or tolerance changed after analysis v1; run the analysis again before submitting.");
  });

  it('is refused (409) when the work order’s decision rule changed after the analysis', async () => {
    const { workOrder } = await createTestWorkOrder(testApp.deps);
    expect(workOrder.decisionRule).toBe(bench.analysedManifest.lens?.decisionRule);
    const { staged } = await stagedOnOwnLens(workOrder);
    await testApp.deps.db.update(workOrders).set({ decisionRule: 'simple' }).where(eq(workOrders.id, workOrder.id));
    await expectRefusedAndUnchanged(staged, "The work order's decision rule changed to simple after analysis v1; run the analysis again before submitting.");
  });

  it('is refused (409) when the analysis ran without the lens block', async () => {
    const { staged } = await stagedOnOwnLens();
    const { lens: _omitted, ...withoutLens } = bench.analysedManifest;
    await testApp.deps.db.update(analysisRuns).set({ manifest: { manifest: withoutLens, files: [] } }).where(eq(analysisRuns.id, staged.analysisRunId));
    await expectRefusedAndUnchanged(
      staged,
      "Analysis v1 was run without the lens's nominal focal length and tolerance, so it holds no conformity decision; run the analysis again before submitting.",
    );
  });

  it('the work order’s decision rule cannot change (409) once one of its measurements is submitted, and can before', async () => {
    const { workOrder } = await createTestWorkOrder(testApp.deps);
    const other = workOrder.decisionRule === 'simple' ? 'guarded' : 'simple';
    const { staged } = await stagedOnOwnLens(workOrder);
    const patchRule = (decisionRule: string) =>
      sessions.technician.agent.patch(`/api/work-orders/${workOrder.id}`).set(CSRF_HEADER_NAME, sessions.technician.csrfToken).send({ decisionRule });
    expect((await patchRule(other)).status).toBeLessThan(300);
    expect((await patchRule(workOrder.decisionRule)).status).toBeLessThan(300);
    expect((await post(performer, actions.submit.path(staged.id))).status).toBe(200);
    const refused = await patchRule(other);
    expect(refused.status, JSON.stringify(refused.body)).toBe(409);
    expect(refused.body.error.fields.decisionRule).toBe(
      `Field "decisionRule" cannot change: measurement ${staged.number} of this work order is submitted under the ${workOrder.decisionRule} rule.`,
    );
    const [row] = await testApp.deps.db.select({ decisionRule: workOrders.decisionRule }).from(workOrders).where(eq(workOrders.id, workOrder.id));
    expect(row.decisionRule).toBe(workOrder.decisionRule);
  });

  it('goes through (200) when only the lens description changed after the analysis', async () => {
    const { lens, staged } = await stagedOnOwnLens();
    const edited = await sessions.technician.agent.patch(`/api/lenses/${lens.id}`).set(CSRF_HEADER_NAME, sessions.technician.csrfToken).send({ description: 'Plano-convex singlet, AR coated' });
    expect(edited.status, JSON.stringify(edited.body)).toBeLessThan(300);
    expect((await post(performer, actions.submit.path(staged.id))).status).toBe(200);
    expect(await measurementStatusOf(testApp, staged.id)).toBe('submitted');
  });
});

describe('the review queue', () => {
  it('lists submitted measurements oldest first and approved ones awaiting a certificate, with f ± U and the people', async () => {
    const older = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'submitted' });
    const newer = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'submitted' });
    const waiting = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'approved', approvedById: otherReviewerId });
    const done = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'certified' });
    await testApp.deps.db.update(measurements).set({ submittedAt: new Date(Date.now() - 3_600_000) }).where(eq(measurements.id, older.id));

    expect((await sessions.technician.agent.get('/api/review-queue')).status).toBe(403);
    const queue = await sessions.reviewer.agent.get('/api/review-queue');
    expect(queue.status).toBe(200);
    const submittedIds = queue.body.submitted.map((i: { measurementId: string }) => i.measurementId);
    expect(submittedIds.indexOf(older.id)).toBeGreaterThanOrEqual(0);
    expect(submittedIds.indexOf(older.id)).toBeLessThan(submittedIds.indexOf(newer.id));
    expect(submittedIds).not.toContain(waiting.id);
    expect(submittedIds).not.toContain(done.id);
    const olderItem = queue.body.submitted.find((i: { measurementId: string }) => i.measurementId === older.id);
    expect(olderItem).toMatchObject({
      number: older.number,
      lens: { identifier: bench.lens.identifier },
      workOrder: { number: bench.workOrder.number },
      client: { name: bench.organisation.name },
      performedBy: { id: performer.person.id },
      focalLengthMm: bench.result.focalLengthMm,
      expandedUncertaintyMm: bench.result.expandedUncertaintyMm,
    });
    expect(olderItem.waitingSeconds).toBeGreaterThanOrEqual(3_590);
    expect(queue.body.awaitingCertificate.map((i: { measurementId: string }) => i.measurementId)).toContain(waiting.id);
  });
});

describe('a certified measurement is read-only', () => {
  const mutations: { name: string; request: (s: SignedInSession, ids: Awaited<ReturnType<typeof stageMeasurement>> & { lensId: string }) => ReturnType<typeof post> }[] = [
    { name: 'PATCH the measurement', request: (s, m) => s.agent.patch(`/api/measurements/${m.id}`).set(CSRF_HEADER_NAME, s.csrfToken).send({ notes: 'late note' }) },
    { name: 'POST a sweep', request: (s, m) => post(s, `/api/measurements/${m.id}/sweeps`, { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 310 }) },
    { name: 'PATCH a sweep', request: (s, m) => s.agent.patch(`/api/sweeps/${m.sweepId}`).set(CSRF_HEADER_NAME, s.csrfToken).send({ lensPositionMm: 301 }) },
    { name: 'DELETE a sweep', request: (s, m) => s.agent.delete(`/api/sweeps/${m.sweepId}`).set(CSRF_HEADER_NAME, s.csrfToken) },
    { name: 'PUT readings', request: (s, m) => s.agent.put(`/api/sweeps/${m.sweepId}/readings`).set(CSRF_HEADER_NAME, s.csrfToken).send({ mode: 'table', rows: [{ fileName: '0001.jpg', positionMm: 451 }] }) },
    { name: 'exclude a frame', request: (s, m) => s.agent.patch(`/api/frames/${m.frameId}`).set(CSRF_HEADER_NAME, s.csrfToken).send({ excluded: true }) },
    { name: 'DELETE a frame', request: (s, m) => s.agent.delete(`/api/frames/${m.frameId}`).set(CSRF_HEADER_NAME, s.csrfToken) },
    { name: 'request a re-analysis', request: (s, m) => post(s, `/api/measurements/${m.id}/analyses`) },
    { name: 'change the lens specification', request: (s, m) => s.agent.patch(`/api/lenses/${m.lensId}`).set(CSRF_HEADER_NAME, s.csrfToken).send({ tolerancePercent: 5 }) },
  ];

  it.each(mutations)('$name answers 409 with a sentence naming the certified state', async ({ request }) => {
    // A lens of its own, so no other staged measurement's state decides the lens answer.
    const lens = await createTestLens(testApp.deps, bench.workOrder.id, { nominalFocalLengthMm: bench.lens.nominalFocalLengthMm, tolerancePercent: 2 });
    const staged = await stageMeasurement(testApp, { ...bench, lens }, { performedById: performer.person.id, status: 'certified' });
    const response = await request(sessions.technician, { ...staged, lensId: lens.id });
    expect(response.status, JSON.stringify(response.body)).toBe(409);
    expect(response.body.error.message).toMatch(/certified/);
    expect(await measurementStatusOf(testApp, staged.id)).toBe('certified');
  });

  it('uploading a frame to a certified measurement answers 409', async () => {
    const staged = await stageMeasurement(testApp, bench, { performedById: performer.person.id, status: 'certified' });
    const response = await sessions.technician.agent
      .post(`/api/sweeps/${staged.sweepId}/frames`)
      .set(CSRF_HEADER_NAME, sessions.technician.csrfToken)
      .attach('frame', Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 0x10]), '0002.jpg');
    expect(response.status, JSON.stringify(response.body)).toBe(409);
    expect(response.body.error.message).toMatch(/certified/);
  });
});
