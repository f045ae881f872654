import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LENS_FIELD_MESSAGES } from '../../../shared/schemas/lenses';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestOrganisation, uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { insertLens, insertMeasurement, insertWorkOrder, latestAuditEvent, sendJson } from './catalogue-fixtures';

let testApp: TestApp;
let technician: SignedInSession;
let admin: SignedInSession;
let reviewer: SignedInSession;
let client: SignedInSession;
let orgA: { id: string; name: string };
let orgB: { id: string; name: string };

beforeAll(async () => {
  testApp = createTestApp();
  orgA = await createTestOrganisation(testApp.deps, { kind: 'client' });
  orgB = await createTestOrganisation(testApp.deps, { kind: 'client' });
  technician = await signedInWithRoles(testApp, ['technician']);
  admin = await signedInWithRoles(testApp, ['admin']);
  reviewer = await signedInWithRoles(testApp, ['reviewer']);
  client = await signedInWithRoles(testApp, ['client'], { organisationId: orgA.id });
});

afterAll(async () => {
  await testApp?.close();
});

describe('POST /api/work-orders/:workOrderId/lenses', () => {
  it('adds a lens given its focal length, and records lens.created', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const response = await sendJson(technician, 'post', `/api/work-orders/${order.id}/lenses`, {
      identifier: ' SN-0001 ',
      description: 'Plano-convex, Ø 25 mm',
      partNumber: 'PCX-100',
      nominalFocalLengthMm: 100,
      tolerancePercent: 1,
    });
    expect(response.status).toBe(201);
    expect(response.body.lens).toEqual({
      id: expect.any(String),
      identifier: 'SN-0001',
      description: 'Plano-convex, Ø 25 mm',
      partNumber: 'PCX-100',
      nominalFocalLengthMm: 100,
      nominalPowerDioptres: 10,
      tolerancePercent: 1,
      toleranceMm: null,
      kind: 'converging',
      latestMeasurement: null,
    });
    const event = await latestAuditEvent(testApp.deps.db, 'lens.created', response.body.lens.id);
    expect(event).toMatchObject({ actorId: technician.person.id, details: { workOrderId: order.id, givenAs: 'focal-length' } });
  });

  it('stores a power in dioptres as f = 1000/P and derives the kind from the sign', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const diverging = await sendJson(admin, 'post', `/api/work-orders/${order.id}/lenses`, {
      identifier: 'NEG-1',
      nominalPowerDioptres: -20,
      toleranceMm: 0.5,
    });
    expect(diverging.status).toBe(201);
    expect(diverging.body.lens).toMatchObject({ nominalFocalLengthMm: -50, nominalPowerDioptres: -20, kind: 'diverging', toleranceMm: 0.5 });

    const converging = await sendJson(admin, 'post', `/api/work-orders/${order.id}/lenses`, {
      identifier: 'POS-1',
      nominalPowerDioptres: 4,
      tolerancePercent: 3,
      toleranceMm: 5,
    });
    expect(converging.body.lens).toMatchObject({ nominalFocalLengthMm: 250, nominalPowerDioptres: 4, kind: 'converging', tolerancePercent: 3, toleranceMm: 5 });
    const event = await latestAuditEvent(testApp.deps.db, 'lens.created', converging.body.lens.id);
    expect(event.details).toMatchObject({ givenAs: 'power', nominalFocalLengthMm: 250 });
  });

  it('asks for exactly one of focal length and power, and for a tolerance, naming the fields', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const path = `/api/work-orders/${order.id}/lenses`;

    const both = await sendJson(technician, 'post', path, { identifier: 'X', nominalFocalLengthMm: 100, nominalPowerDioptres: 10, tolerancePercent: 1 });
    expect(both.status).toBe(400);
    expect(both.body.error.fields).toEqual({ nominalFocalLengthMm: LENS_FIELD_MESSAGES.both, nominalPowerDioptres: LENS_FIELD_MESSAGES.both });
    expect(LENS_FIELD_MESSAGES.both).toBe('Give either "nominalFocalLengthMm" or "nominalPowerDioptres", not both.');

    const neither = await sendJson(technician, 'post', path, { identifier: 'X', toleranceMm: 1 });
    expect(neither.body.error.fields).toEqual({
      nominalFocalLengthMm: 'Give the nominal focal length ("nominalFocalLengthMm", in mm) or the nominal power ("nominalPowerDioptres", in D).',
      nominalPowerDioptres: 'Give the nominal focal length ("nominalFocalLengthMm", in mm) or the nominal power ("nominalPowerDioptres", in D).',
    });

    const noTolerance = await sendJson(technician, 'post', path, { identifier: 'X', nominalFocalLengthMm: 100 });
    expect(noTolerance.body.error.fields).toEqual({
      tolerancePercent: 'Give a tolerance: "tolerancePercent" (± % of the nominal focal length) or "toleranceMm" (± mm), or both.',
      toleranceMm: 'Give a tolerance: "tolerancePercent" (± % of the nominal focal length) or "toleranceMm" (± mm), or both.',
    });

    const badNumbers = await sendJson(technician, 'post', path, {
      identifier: '',
      nominalFocalLengthMm: 0,
      tolerancePercent: 150,
      toleranceMm: -1,
    });
    expect(badNumbers.body.error.fields).toEqual({
      identifier: 'Field "identifier" must not be empty.',
      nominalFocalLengthMm: 'Field "nominalFocalLengthMm" must not be zero.',
      tolerancePercent: 'Field "tolerancePercent" must be at most 100 %.',
      toleranceMm: 'Field "toleranceMm" must be greater than 0 mm.',
    });

    const text = await sendJson(technician, 'post', path, { identifier: 'X', nominalFocalLengthMm: '100', toleranceMm: 1 });
    expect(text.body.error.fields).toEqual({ nominalFocalLengthMm: 'Field "nominalFocalLengthMm" must be a number (mm).' });
  });

  it('refuses a second lens with the same identifier on one order (any letter case) but not on another order', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const other = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const body = { identifier: 'DUP-7', nominalFocalLengthMm: 50, toleranceMm: 0.5 };
    expect((await sendJson(technician, 'post', `/api/work-orders/${order.id}/lenses`, body)).status).toBe(201);
    const again = await sendJson(technician, 'post', `/api/work-orders/${order.id}/lenses`, { ...body, identifier: 'dup-7' });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe(`A lens with the identifier "dup-7" is already on work order ${order.number}.`);
    expect((await sendJson(technician, 'post', `/api/work-orders/${other.id}/lenses`, body)).status).toBe(201);
  });

  it('refuses lenses on a completed order and on an unknown one', async () => {
    const done = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id, status: 'completed' });
    const closed = await sendJson(technician, 'post', `/api/work-orders/${done.id}/lenses`, { identifier: 'L', nominalFocalLengthMm: 50, toleranceMm: 1 });
    expect(closed.status).toBe(409);
    expect(closed.body.error.message).toBe(`Work order ${done.number} is completed; reopen it before adding lenses.`);

    const unknownId = '00000000-0000-4000-8000-000000000000';
    const missing = await sendJson(technician, 'post', `/api/work-orders/${unknownId}/lenses`, { identifier: 'L', nominalFocalLengthMm: 50, toleranceMm: 1 });
    expect(missing.status).toBe(404);
  });
});

describe('GET /api/lenses/:lensId', () => {
  it('returns the lens, its work order and its measurements newest first with their current results', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id, decisionRule: 'guarded', title: 'History order' });
    const lens = await insertLens(testApp.deps.db, { workOrderId: order.id, identifier: 'H-1', nominalFocalLengthMm: 75, tolerancePercent: 2 });
    const oldest = await insertMeasurement(testApp.deps.db, {
      lensId: lens.id,
      performedById: technician.person.id,
      createdAt: new Date('2026-01-10T09:00:00Z'),
      measuredOn: '2026-01-10',
      result: { focalLengthMm: 75.31, expandedUncertaintyMm: 0.21, coverageFactor: 2.1, decision: 'conforms' },
      version: 3,
    });
    const failed = await insertMeasurement(testApp.deps.db, {
      lensId: lens.id,
      createdAt: new Date('2026-01-11T09:00:00Z'),
      result: { focalLengthMm: 1, expandedUncertaintyMm: 1 },
      runStatus: 'failed',
      status: 'analysis-failed',
    });
    const newest = await insertMeasurement(testApp.deps.db, { lensId: lens.id, createdAt: new Date('2026-01-12T09:00:00Z') });

    const response = await reviewer.agent.get(`/api/lenses/${lens.id}`);
    expect(response.status).toBe(200);
    const body = response.body.lens;
    expect(body).toMatchObject({
      id: lens.id,
      identifier: 'H-1',
      nominalFocalLengthMm: 75,
      kind: 'converging',
      workOrder: { id: order.id, number: order.number, title: 'History order', decisionRule: 'guarded', organisation: { id: orgA.id, name: orgA.name } },
      latestMeasurement: { id: newest.measurementId, status: 'draft', focalLengthMm: null, expandedUncertaintyMm: null, decision: null },
    });
    expect(body.nominalPowerDioptres).toBeCloseTo(13.3333333, 6);
    expect(body.measurements.map((m: { id: string }) => m.id)).toEqual([newest.measurementId, failed.measurementId, oldest.measurementId]);
    expect(body.measurements[1]).toMatchObject({ status: 'analysis-failed', analysisVersion: null, focalLengthMm: null });
    expect(body.measurements[2]).toEqual({
      id: oldest.measurementId,
      number: oldest.number,
      method: 'finite-conjugate',
      status: 'analysed',
      measuredOn: '2026-01-10',
      performedBy: { id: technician.person.id, name: technician.person.name },
      analysisVersion: 3,
      focalLengthMm: 75.31,
      expandedUncertaintyMm: 0.21,
      coverageFactor: 2.1,
      decision: 'conforms',
    });
  });

  it('shows a client their own lens and answers 404 for another organisation\'s', async () => {
    const own = await insertLens(testApp.deps.db, { workOrderId: (await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id })).id });
    const foreign = await insertLens(testApp.deps.db, { workOrderId: (await insertWorkOrder(testApp.deps.db, { organisationId: orgB.id })).id });
    expect((await client.agent.get(`/api/lenses/${own.id}`)).status).toBe(200);
    const response = await client.agent.get(`/api/lenses/${foreign.id}`);
    expect(response.status).toBe(404);
    expect(response.body).toEqual({ error: { message: `There is no lens with id ${foreign.id}.` } });
  });
});

describe('PATCH /api/lenses/:lensId', () => {
  it('changes any field, takes a power instead of a focal length, and records lens.updated', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const lens = await insertLens(testApp.deps.db, { workOrderId: order.id, identifier: 'P-1', tolerancePercent: 1, toleranceMm: null });
    const response = await sendJson(technician, 'patch', `/api/lenses/${lens.id}`, {
      identifier: 'P-1A',
      partNumber: 'NEW-PN',
      nominalPowerDioptres: 5,
      toleranceMm: 2,
      tolerancePercent: null,
    });
    expect(response.status).toBe(200);
    expect(response.body.lens).toMatchObject({
      identifier: 'P-1A',
      partNumber: 'NEW-PN',
      nominalFocalLengthMm: 200,
      tolerancePercent: null,
      toleranceMm: 2,
    });
    const event = await latestAuditEvent(testApp.deps.db, 'lens.updated', lens.id);
    expect(event.details).toMatchObject({
      changedFields: ['identifier', 'partNumber', 'nominalFocalLengthMm', 'tolerancePercent', 'toleranceMm'],
      before: { nominalFocalLengthMm: 100, tolerancePercent: 1 },
      after: { nominalFocalLengthMm: 200, tolerancePercent: null },
    });
  });

  it('refuses to leave a lens without a tolerance', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const lens = await insertLens(testApp.deps.db, { workOrderId: order.id, tolerancePercent: 1, toleranceMm: null });
    const response = await sendJson(technician, 'patch', `/api/lenses/${lens.id}`, { tolerancePercent: null });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toEqual({
      tolerancePercent: 'The lens would be left without a tolerance: keep "tolerancePercent" or "toleranceMm".',
      toleranceMm: 'The lens would be left without a tolerance: keep "tolerancePercent" or "toleranceMm".',
    });
    const both = await sendJson(technician, 'patch', `/api/lenses/${lens.id}`, { nominalFocalLengthMm: 10, nominalPowerDioptres: 100 });
    expect(both.body.error.fields.nominalPowerDioptres).toBe(LENS_FIELD_MESSAGES.both);
  });

  it('fixes the nominal value and tolerance once a measurement is submitted, but still takes a new description', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    const lens = await insertLens(testApp.deps.db, { workOrderId: order.id });
    const submitted = await insertMeasurement(testApp.deps.db, {
      lensId: lens.id,
      status: 'submitted',
      result: { focalLengthMm: 100.1, expandedUncertaintyMm: 0.2 },
    });
    const spec = await sendJson(technician, 'patch', `/api/lenses/${lens.id}`, { tolerancePercent: 2 });
    expect(spec.status).toBe(409);
    expect(spec.body.error.message).toBe(`Measurement ${submitted.number} of this lens is submitted; its nominal value and tolerance can no longer change.`);
    const description = await sendJson(technician, 'patch', `/api/lenses/${lens.id}`, { description: 'Edge chip at 3 o\'clock' });
    expect(description.status).toBe(200);
    expect(description.body.lens.description).toBe("Edge chip at 3 o'clock");
  });

  it('refuses an identifier another lens of the order already has', async () => {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId: orgA.id });
    await insertLens(testApp.deps.db, { workOrderId: order.id, identifier: 'TAKEN' });
    const lens = await insertLens(testApp.deps.db, { workOrderId: order.id, identifier: 'FREE' });
    const response = await sendJson(technician, 'patch', `/api/lenses/${lens.id}`, { identifier: 'Taken' });
    expect(response.status).toBe(409);
    expect(response.body.error.fields.identifier).toBe(`A lens with the identifier "Taken" is already on work order ${order.number}.`);
  });
});

describe('GET /api/part-numbers/:partNumber/spread', () => {
  async function batchOf(partNumber: string, count: number, organisationId = orgA.id) {
    const order = await insertWorkOrder(testApp.deps.db, { organisationId });
    const made = [];
    for (let i = 1; i <= count; i++) {
      made.push(
        await insertLens(testApp.deps.db, {
          workOrderId: order.id,
          identifier: `${partNumber}-${i}`,
          partNumber,
          nominalFocalLengthMm: 100,
          tolerancePercent: 1,
          createdAt: new Date(Date.UTC(2026, 0, i)),
        }),
      );
    }
    return made;
  }

  it('plots the latest analysed result per lens and computes Cp and Cpk against the band (hand-worked figures)', async () => {
    const partNumber = `PN-${uniqueSuffix()}`;
    const lenses = await batchOf(partNumber, 8);
    const results = [100.1, 100.3, 100.5, 100.7, 100.9];
    for (const [i, focalLengthMm] of results.entries()) {
      await insertMeasurement(testApp.deps.db, {
        lensId: lenses[i].id,
        createdAt: new Date('2026-02-01T00:00:00Z'),
        result: { focalLengthMm, expandedUncertaintyMm: 0.2, decision: 'conforms' },
      });
    }
    // Lens 1 was measured again later: only the newer result counts.
    await insertMeasurement(testApp.deps.db, {
      lensId: lenses[0].id,
      createdAt: new Date('2026-01-01T00:00:00Z'),
      result: { focalLengthMm: 98.0, expandedUncertaintyMm: 0.2, decision: 'does-not-conform' },
    });
    // Lens 6's only result was returned by a reviewer; lens 7 has only a draft; lens 8 was never measured.
    await insertMeasurement(testApp.deps.db, { lensId: lenses[5].id, status: 'returned', result: { focalLengthMm: 120, expandedUncertaintyMm: 0.2 } });
    await insertMeasurement(testApp.deps.db, { lensId: lenses[6].id });

    const response = await reviewer.agent.get(`/api/part-numbers/${encodeURIComponent(partNumber)}/spread`);
    expect(response.status).toBe(200);
    const body = response.body;
    expect(body).toMatchObject({
      partNumber,
      nominalFocalLengthMm: 100,
      tolerancePercent: 1,
      toleranceMm: null,
      lowerLimitMm: 99,
      upperLimitMm: 101,
      lensCount: 8,
      specificationsDiffer: false,
      statsNote: null,
    });
    expect(body.points.map((p: { identifier: string; focalLengthMm: number }) => [p.identifier, p.focalLengthMm])).toEqual(
      results.map((f, i) => [`${partNumber}-${i + 1}`, f]),
    );
    expect(body.points[0]).toMatchObject({ lensId: lenses[0].id, expandedUncertaintyMm: 0.2, decision: 'conforms' });
    // From memory: Cp = (USL − LSL)/(6σ), Cpk = min(USL − μ, μ − LSL)/(3σ), common practice in process capability.
    // By hand: mean 100.5, s = √(0.4/4) = 0.316228, Cp = 2/(6s) = 1.054093, Cpk = 0.5/(3s) = 0.527046.
    expect(body.stats.count).toBe(5);
    expect(body.stats.meanMm).toBeCloseTo(100.5, 10);
    expect(body.stats.standardDeviationMm).toBeCloseTo(0.316228, 6);
    expect(body.stats.cp).toBeCloseTo(1.054093, 6);
    expect(body.stats.cpk).toBeCloseTo(0.527046, 6);
  });

  it('gives null stats with a reason below two results, and null Cp/Cpk for zero spread', async () => {
    const none = `PN-${uniqueSuffix()}`;
    await batchOf(none, 2);
    const empty = await technician.agent.get(`/api/part-numbers/${none}/spread`);
    expect(empty.body).toMatchObject({ points: [], stats: null, statsNote: 'Cp and Cpk need measured results from at least two lenses; none has one yet.' });

    const one = `PN-${uniqueSuffix()}`;
    const [first] = await batchOf(one, 2);
    await insertMeasurement(testApp.deps.db, { lensId: first.id, result: { focalLengthMm: 100.2, expandedUncertaintyMm: 0.2 } });
    const single = await technician.agent.get(`/api/part-numbers/${one}/spread`);
    expect(single.body.points).toHaveLength(1);
    expect(single.body).toMatchObject({ stats: null, statsNote: 'Cp and Cpk need measured results from at least two lenses; only one has one yet.' });

    const flat = `PN-${uniqueSuffix()}`;
    for (const lens of await batchOf(flat, 3)) {
      await insertMeasurement(testApp.deps.db, { lensId: lens.id, result: { focalLengthMm: 100.25, expandedUncertaintyMm: 0.2 } });
    }
    const zero = await technician.agent.get(`/api/part-numbers/${flat}/spread`);
    expect(zero.body.stats).toEqual({ count: 3, meanMm: 100.25, standardDeviationMm: 0, cp: null, cpk: null });
    expect(zero.body.statsNote).toBe('All measured focal lengths are identical, so the spread is zero and Cp and Cpk are undefined.');
  });

  it('narrows to one organisation on request, notes differing specifications, and answers 404 for an unknown part number', async () => {
    const shared = `PN-${uniqueSuffix()}`;
    await batchOf(shared, 2, orgA.id);
    const [foreign] = await batchOf(shared, 1, orgB.id);
    const all = await admin.agent.get(`/api/part-numbers/${shared}/spread`);
    expect(all.body.lensCount).toBe(3);
    expect(all.body.specificationsDiffer).toBe(false);
    const onlyA = await admin.agent.get(`/api/part-numbers/${shared}/spread?organisationId=${orgA.id}`);
    expect(onlyA.body.lensCount).toBe(2);

    await sendJson(technician, 'patch', `/api/lenses/${foreign.id}`, { toleranceMm: 0.5 });
    const differing = await admin.agent.get(`/api/part-numbers/${shared}/spread`);
    expect(differing.body.specificationsDiffer).toBe(true);

    const unknown = await admin.agent.get(`/api/part-numbers/NO-SUCH-${uniqueSuffix()}/spread`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.message).toMatch(/^No lens has the part number "NO-SUCH-[0-9a-f]+"\.$/);
  });
});
