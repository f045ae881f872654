import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, auditEvents, measurements, sweeps } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import {
  createTestBench,
  createTestEquipment,
  createTestLens,
  createTestWorkOrder,
  finiteConjugateBody,
  isoDateFromToday,
  type TestBench,
} from './bench-records';

let testApp: TestApp;
let technician: SignedInSession;
let otherTechnician: SignedInSession;
let reviewer: SignedInSession;
let bench: TestBench;
let workOrderId: string;
let lensId: string;

beforeAll(async () => {
  testApp = createTestApp();
  technician = await signedInWithRoles(testApp, ['technician']);
  otherTechnician = await signedInWithRoles(testApp, ['technician']);
  reviewer = await signedInWithRoles(testApp, ['reviewer']);
  bench = await createTestBench(testApp.deps);
  const { workOrder } = await createTestWorkOrder(testApp.deps);
  workOrderId = workOrder.id;
  lensId = (await createTestLens(testApp.deps, workOrderId, { nominalFocalLengthMm: 100 })).id;
});

afterAll(async () => {
  await testApp?.close();
});

function post(session: SignedInSession, path: string, body: object) {
  return session.agent.post(path).set(CSRF_HEADER_NAME, session.csrfToken).send(body);
}
function patch(session: SignedInSession, path: string, body: object) {
  return session.agent.patch(path).set(CSRF_HEADER_NAME, session.csrfToken).send(body);
}
function del(session: SignedInSession, path: string) {
  return session.agent.delete(path).set(CSRF_HEADER_NAME, session.csrfToken);
}

describe('POST /api/measurements', () => {
  it('creates a finite-conjugate measurement with its sweep, numbered M-YYYY-NNNN, performed by the technician, in draft', async () => {
    const response = await post(technician, '/api/measurements', { ...finiteConjugateBody(lensId, bench), notes: 'Lamp warmed up 20 min.' });
    expect(response.status).toBe(201);
    const m = response.body.measurement;
    expect(m.number).toMatch(/^M-\d{4}-\d{4,}$/);
    expect(m).toMatchObject({
      method: 'finite-conjugate',
      status: 'draft',
      lens: { id: lensId, nominalFocalLengthMm: 100, kind: 'converging' },
      workOrder: { id: workOrderId, decisionRule: 'guarded' },
      performedBy: { id: technician.person.id },
      temperatureC: 21.5,
      relativeHumidityPercent: 45,
      focusOperator: 'gradient-energy',
      notes: 'Lamp warmed up 20 min.',
      overrides: [],
      currentAnalysis: null,
      analyses: [],
    });
    expect(m.equipment.map((e: { role: string; id: string }) => [e.role, e.id])).toEqual([
      ['camera', bench.camera.id],
      ['target', bench.target.id],
      ['rail-scale', bench.railScale.id],
    ]);
    expect(m.equipment[0]).toMatchObject({ kind: 'camera', calibrationState: 'current', values: { pixelPitchUm: 3.45 } });
    expect(m.sweeps).toEqual([
      expect.objectContaining({ position: 0, moving: 'sensor', objectPositionMm: 0, lensPositionMm: 300, sensorPositionMm: null, frames: [] }),
    ]);
    const [event] = await testApp.deps.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.subjectId, m.id), eq(auditEvents.action, 'measurement.created')));
    expect(event).toMatchObject({ actorId: technician.person.id, details: expect.objectContaining({ number: m.number, method: 'finite-conjugate' }) });
  });

  it('creates each method with what it needs: multi-conjugate (2 sweeps), displacement (lens moving, D > 4f), collimator, auxiliary lens for a diverging lens', async () => {
    const base = finiteConjugateBody(lensId, bench);
    const multi = await post(technician, '/api/measurements', {
      ...base,
      method: 'multi-conjugate',
      sweeps: [
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 250 },
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 400 },
      ],
    });
    expect(multi.status).toBe(201);
    expect(multi.body.measurement.sweeps.map((s: { position: number }) => s.position)).toEqual([0, 1]);

    const displacement = await post(technician, '/api/measurements', {
      ...base,
      method: 'displacement',
      sweeps: [{ moving: 'lens', objectPositionMm: 0, sensorPositionMm: 500 }],
    });
    expect(displacement.status).toBe(201);

    const collimator = await post(technician, '/api/measurements', {
      ...base,
      method: 'collimator',
      collimatorId: bench.collimator.id,
      sweeps: [{ moving: 'sensor', lensPositionMm: 100 }],
    });
    expect(collimator.status).toBe(201);
    expect(collimator.body.measurement.equipment.map((e: { role: string }) => e.role)).toEqual(['camera', 'target', 'rail-scale', 'collimator']);

    const diverging = await createTestLens(testApp.deps, workOrderId, { nominalFocalLengthMm: -150 });
    const auxiliary = await post(technician, '/api/measurements', {
      ...base,
      lensId: diverging.id,
      method: 'auxiliary-lens',
      auxiliaryLensId: bench.auxiliaryLens.id,
    });
    expect(auxiliary.status).toBe(201);
    expect(auxiliary.body.measurement.lens.kind).toBe('diverging');
    expect(auxiliary.body.measurement.equipment.at(-1)).toMatchObject({ role: 'auxiliary-lens', id: bench.auxiliaryLens.id });
  });

  it('refuses a method without what it needs, naming the field', async () => {
    const base = finiteConjugateBody(lensId, bench);
    const cases: [object, string, string][] = [
      [{ method: 'collimator', sweeps: [{ moving: 'sensor', lensPositionMm: 100 }] }, 'collimatorId', 'Field "collimatorId" is required for the collimator method: choose the collimator used.'],
      [{ method: 'auxiliary-lens' }, 'auxiliaryLensId', 'Field "auxiliaryLensId" is required for the auxiliary-lens method: choose the auxiliary lens used.'],
      [{ method: 'multi-conjugate' }, 'sweeps', 'The multi-conjugate method needs at least 2 sweeps at different object distances.'],
      [{ method: 'displacement' }, 'sweeps.0.moving', 'Sweep 1: moving must be "lens" for the displacement method.'],
      [
        { method: 'displacement', sweeps: [{ moving: 'lens', objectPositionMm: 0, sensorPositionMm: 380 }] },
        'sweeps.0.sensorPositionMm',
        'Sweep 1: the object–sensor distance (380 mm) must exceed 4 × the nominal focal length (400 mm) for the displacement method.',
      ],
      [{ sweeps: [] }, 'sweeps', 'Field "sweeps" must hold at least one sweep.'],
    ];
    for (const [change, field, sentence] of cases) {
      const response = await post(technician, '/api/measurements', { ...base, ...change });
      expect(response.status, field).toBe(400);
      expect(response.body.error.fields[field], field).toBe(sentence);
    }
  });

  it('refuses a diverging lens without the auxiliary-lens method, an unknown lens, equipment of the wrong kind and retired equipment', async () => {
    const base = finiteConjugateBody(lensId, bench);
    const diverging = await createTestLens(testApp.deps, workOrderId, { nominalFocalLengthMm: -80 });
    const retired = await createTestEquipment(testApp.deps, 'rail-scale', { active: false });

    const divergingResponse = await post(technician, '/api/measurements', { ...base, lensId: diverging.id });
    expect(divergingResponse.status).toBe(400);
    expect(divergingResponse.body.error.fields.method).toBe(
      'The lens is diverging (nominal -80 mm) and forms no real image on its own; measure it with the auxiliary-lens method.',
    );

    const unknownLens = await post(technician, '/api/measurements', { ...base, lensId: '00000000-0000-4000-8000-000000000000' });
    expect(unknownLens.status).toBe(400);
    expect(unknownLens.body.error.message).toBe('lensId: there is no lens with id 00000000-0000-4000-8000-000000000000.');

    const wrongKind = await post(technician, '/api/measurements', { ...base, cameraId: bench.target.id });
    expect(wrongKind.status).toBe(400);
    expect(wrongKind.body.error.fields).toEqual({ cameraId: `cameraId: ${bench.target.identifier} is a target, not a camera.` });

    const retiredResponse = await post(technician, '/api/measurements', { ...base, railScaleId: retired.id });
    expect(retiredResponse.status).toBe(400);
    expect(retiredResponse.body.error.message).toBe(`railScaleId: rail scale ${retired.identifier} has been retired from the register; choose another.`);
  });

  it('refuses equipment past its calibration due date without an override, and records the override with who and when', async () => {
    const dueDate = isoDateFromToday(-3);
    const overdueCamera = await createTestEquipment(testApp.deps, 'camera', { calibrationDueDate: dueDate });
    const body = { ...finiteConjugateBody(lensId, bench), cameraId: overdueCamera.id };

    const refused = await post(technician, '/api/measurements', body);
    expect(refused.status).toBe(400);
    const sentence = `cameraId: camera ${overdueCamera.identifier} is past its calibration due date (${dueDate}); give a reason to use it anyway.`;
    expect(refused.body.error).toEqual({ message: sentence, fields: { cameraId: sentence } });

    const emptyReason = await post(technician, '/api/measurements', { ...body, overrides: [{ equipmentId: overdueCamera.id, reason: '   ' }] });
    expect(emptyReason.status).toBe(400);
    expect(emptyReason.body.error.fields['overrides.0.reason']).toBe(
      'An override needs a reason: say why this equipment may be used past its calibration due date.',
    );

    const notNeeded = await post(technician, '/api/measurements', {
      ...body,
      overrides: [
        { equipmentId: overdueCamera.id, reason: 'Recalibration booked' },
        { equipmentId: bench.target.id, reason: 'Just in case' },
      ],
    });
    expect(notNeeded.status).toBe(400);
    expect(notNeeded.body.error.fields).toEqual({
      'overrides.1.equipmentId': expect.stringMatching(/^overrides\.1\.equipmentId: target .* is within its calibration date \(due \d{4}-\d{2}-\d{2}\); no override is needed\.$/),
    });

    const before = Date.now();
    const accepted = await post(technician, '/api/measurements', {
      ...body,
      overrides: [{ equipmentId: overdueCamera.id, reason: '  Recalibration booked for next week; pitch checked against the reference grid today.  ' }],
    });
    expect(accepted.status).toBe(201);
    const m = accepted.body.measurement;
    expect(m.equipment[0]).toMatchObject({ role: 'camera', id: overdueCamera.id, calibrationState: 'overdue', calibrationDueDate: dueDate });
    expect(m.overrides).toEqual([
      {
        equipmentId: overdueCamera.id,
        identifier: overdueCamera.identifier,
        role: 'camera',
        reason: 'Recalibration booked for next week; pitch checked against the reference grid today.',
        recordedBy: { id: technician.person.id, name: technician.person.name },
        recordedAt: expect.any(String),
      },
    ]);
    expect(Date.parse(m.overrides[0].recordedAt)).toBeGreaterThanOrEqual(before - 1000);
    const events = await testApp.deps.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.subjectId, m.id), eq(auditEvents.action, 'measurement.calibration-override')));
    expect(events).toHaveLength(1);
    expect(events[0].details).toMatchObject({ equipmentId: overdueCamera.id, calibrationDueDate: dueDate });
  });

  it('creates nothing when refused (no measurement, no sweep rows for the lens)', async () => {
    const lens = await createTestLens(testApp.deps, workOrderId);
    const response = await post(technician, '/api/measurements', { ...finiteConjugateBody(lens.id, bench), method: 'multi-conjugate' });
    expect(response.status).toBe(400);
    expect(await testApp.deps.db.select().from(measurements).where(eq(measurements.lensId, lens.id))).toEqual([]);
  });
});

describe('GET /api/measurements', () => {
  it('lists the caller\'s own measurements with mine=true, filters by status and lens, and pages', async () => {
    const lens = await createTestLens(testApp.deps, workOrderId);
    const mine = await post(technician, '/api/measurements', finiteConjugateBody(lens.id, bench));
    const theirs = await post(otherTechnician, '/api/measurements', finiteConjugateBody(lens.id, bench));
    expect([mine.status, theirs.status]).toEqual([201, 201]);

    const byLens = await reviewer.agent.get(`/api/measurements?lensId=${lens.id}`);
    expect(byLens.status).toBe(200);
    expect(byLens.body.total).toBe(2);
    expect(byLens.body.items.map((i: { id: string }) => i.id).sort()).toEqual([mine.body.measurement.id, theirs.body.measurement.id].sort());
    expect(byLens.body.items[0]).toMatchObject({ lens: { id: lens.id, identifier: lens.identifier }, workOrder: { id: workOrderId }, status: 'draft', focalLengthMm: null });

    const onlyMine = await technician.agent.get(`/api/measurements?lensId=${lens.id}&mine=true`);
    expect(onlyMine.body.items.map((i: { id: string }) => i.id)).toEqual([mine.body.measurement.id]);
    expect(onlyMine.body.items[0].performedBy).toEqual({ id: technician.person.id, name: technician.person.name });

    const analysed = await technician.agent.get(`/api/measurements?lensId=${lens.id}&status=analysed,submitted`);
    expect(analysed.body).toMatchObject({ items: [], total: 0 });

    const paged = await reviewer.agent.get(`/api/measurements?lensId=${lens.id}&pageSize=1&page=2&sort=number&order=asc`);
    expect(paged.body).toMatchObject({ total: 2, page: 2, pageSize: 1 });
    expect(paged.body.items).toHaveLength(1);

    const bad = await technician.agent.get('/api/measurements?status=finished');
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.status).toMatch(/^Field "status" must be one or more of: draft, /);
  });
});

describe('GET/PATCH /api/measurements/:measurementId', () => {
  it('answers 404 with a sentence for an unknown id, and 400 for a malformed one', async () => {
    const unknown = await reviewer.agent.get('/api/measurements/00000000-0000-4000-8000-000000000000');
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toBe('There is no measurement with id 00000000-0000-4000-8000-000000000000.');
    expect((await reviewer.agent.get('/api/measurements/not-an-id')).status).toBe(400);
  });

  it('changes environment, notes, focus operator and date, and refuses once submitted', async () => {
    const created = await post(technician, '/api/measurements', finiteConjugateBody(lensId, bench));
    const id = created.body.measurement.id;
    const changed = await patch(technician, `/api/measurements/${id}`, {
      temperatureC: 22.25,
      relativeHumidityPercent: null,
      focusOperator: 'laplacian-variance',
      notes: '',
      measuredOn: '2026-03-31',
    });
    expect(changed.status).toBe(200);
    expect(changed.body.measurement).toMatchObject({
      temperatureC: 22.25,
      relativeHumidityPercent: null,
      focusOperator: 'laplacian-variance',
      notes: null,
      measuredOn: '2026-03-31',
    });

    expect((await patch(technician, `/api/measurements/${id}`, {})).status).toBe(400);
    expect((await patch(technician, `/api/measurements/${id}`, { measuredOn: '2026-02-30' })).body.error.fields.measuredOn).toMatch(/real date/);

    await testApp.deps.db.update(measurements).set({ status: 'submitted' }).where(eq(measurements.id, id));
    const refused = await patch(technician, `/api/measurements/${id}`, { notes: 'late note' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe(`Measurement ${created.body.measurement.number} is submitted; its details can no longer change.`);
  });

  it('reads analysis runs written by the analysis side: every run newest first, and the current one in full', async () => {
    const created = await post(technician, '/api/measurements', finiteConjugateBody(lensId, bench));
    const id = created.body.measurement.id;
    const stored = { manifest: { method: 'finite-conjugate', sweeps: [] }, files: [] };
    const [failed] = await testApp.deps.db
      .insert(analysisRuns)
      .values({ measurementId: id, version: 1, status: 'failed', manifest: stored, errorMessage: 'No focus peak in sweep 1.' })
      .returning();
    const [succeeded] = await testApp.deps.db
      .insert(analysisRuns)
      .values({ measurementId: id, version: 2, status: 'succeeded', manifest: stored, result: { focalLengthMm: 99.93, expandedUncertaintyMm: 0.12, coverageFactor: 2 } })
      .returning();
    await testApp.deps.db.update(measurements).set({ status: 'analysed', currentAnalysisId: succeeded.id }).where(eq(measurements.id, id));

    const detail = await reviewer.agent.get(`/api/measurements/${id}`);
    expect(detail.status).toBe(200);
    expect(detail.body.measurement.analyses.map((a: { id: string; version: number }) => [a.version, a.id])).toEqual([
      [2, succeeded.id],
      [1, failed.id],
    ]);
    expect(detail.body.measurement.analyses[1]).toMatchObject({ status: 'failed', errorMessage: 'No focus peak in sweep 1.' });
    expect(detail.body.measurement.currentAnalysis).toMatchObject({ id: succeeded.id, version: 2, focalLengthMm: 99.93, result: { focalLengthMm: 99.93 } });

    const listed = await reviewer.agent.get(`/api/measurements?lensId=${lensId}&status=analysed`);
    expect(listed.body.items.find((i: { id: string }) => i.id === id)).toMatchObject({ focalLengthMm: 99.93, expandedUncertaintyMm: 0.12 });
  });
});

describe('sweeps', () => {
  it('adds, changes and deletes sweeps, keeping the method\'s needs', async () => {
    const created = await post(technician, '/api/measurements', {
      ...finiteConjugateBody(lensId, bench),
      method: 'multi-conjugate',
      sweeps: [
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 250 },
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 400 },
      ],
    });
    const id = created.body.measurement.id;

    const added = await post(technician, `/api/measurements/${id}/sweeps`, { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 600 });
    expect(added.status).toBe(201);
    expect(added.body.sweep).toMatchObject({ position: 2, lensPositionMm: 600, frames: [] });

    const sameDistance = await post(technician, `/api/measurements/${id}/sweeps`, { moving: 'sensor', objectPositionMm: 50, lensPositionMm: 300 });
    expect(sameDistance.status).toBe(400);
    expect(sameDistance.body.error.fields['sweeps.3.objectPositionMm']).toBe(
      'Sweep 4 has the same object distance (250 mm) as sweep 1; the multi-conjugate method needs different object distances.',
    );

    const moved = await patch(technician, `/api/sweeps/${added.body.sweep.id}`, { lensPositionMm: 650.5 });
    expect(moved.status).toBe(200);
    expect(moved.body.sweep.lensPositionMm).toBe(650.5);

    const backwards = await patch(technician, `/api/sweeps/${added.body.sweep.id}`, { objectPositionMm: 700 });
    expect(backwards.status).toBe(400);
    expect(backwards.body.error.fields['sweeps.2.lensPositionMm']).toMatch(/^Sweep 3: the lens \(650\.5 mm\) must sit after the object \(700 mm\)/);

    const [first, second] = created.body.measurement.sweeps;
    expect((await del(technician, `/api/sweeps/${added.body.sweep.id}`)).status).toBe(204);
    const tooFew = await del(technician, `/api/sweeps/${second.id}`);
    expect(tooFew.status).toBe(400);
    expect(tooFew.body.error.message).toBe('The multi-conjugate method needs at least 2 sweeps at different object distances.');
    const remaining = await testApp.deps.db.select({ id: sweeps.id }).from(sweeps).where(eq(sweeps.measurementId, id));
    expect(remaining.map((s) => s.id).sort()).toEqual([first.id, second.id].sort());
  });

  it('refuses sweep changes while analysing and deleting a sweep once the measurement has an analysis', async () => {
    const created = await post(technician, '/api/measurements', finiteConjugateBody(lensId, bench));
    const id = created.body.measurement.id;
    const added = await post(technician, `/api/measurements/${id}/sweeps`, { moving: 'sensor', objectPositionMm: 10, lensPositionMm: 310 });
    await testApp.deps.db.update(measurements).set({ status: 'analysing' }).where(eq(measurements.id, id));
    const whileAnalysing = await patch(technician, `/api/sweeps/${added.body.sweep.id}`, { lensPositionMm: 320 });
    expect(whileAnalysing.status).toBe(409);
    expect(whileAnalysing.body.error.message).toMatch(/is being analysed; changing a sweep once the analysis has finished\.$/);

    await testApp.deps.db.update(measurements).set({ status: 'analysed' }).where(eq(measurements.id, id));
    await testApp.deps.db.insert(analysisRuns).values({ measurementId: id, version: 1, status: 'failed', manifest: { manifest: {}, files: [] } });
    const refused = await del(technician, `/api/sweeps/${added.body.sweep.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/has been analysed; its sweeps are kept with the analyses that used them\.$/);
  });

  it('answers 404 for an unknown sweep', async () => {
    const response = await patch(technician, '/api/sweeps/00000000-0000-4000-8000-000000000000', { lensPositionMm: 1 });
    expect(response.status).toBe(404);
    expect(response.body.error.message).toBe('There is no sweep with id 00000000-0000-4000-8000-000000000000.');
  });
});
