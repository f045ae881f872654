import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { EquipmentItem } from '../../../shared/schemas/equipment';
import { addDays } from '../../../scripts/seed/demo-equipment';
import { todayIsoDate } from '../../../server/services/equipment';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { latestAuditEvent, sendJson } from './catalogue-fixtures';

let testApp: TestApp;
let admin: SignedInSession;
let technician: SignedInSession;
let suffix: string;

beforeAll(async () => {
  testApp = createTestApp();
  admin = await signedInWithRoles(testApp, ['admin']);
  technician = await signedInWithRoles(testApp, ['technician']);
  suffix = uniqueSuffix().toUpperCase();
});

afterAll(async () => {
  await testApp?.close();
});

function camera(identifier: string, dueInDays = 200) {
  return {
    kind: 'camera',
    identifier,
    description: 'Bench camera',
    serialNumber: `SER-${identifier}`,
    values: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.005, widthPx: 4096, heightPx: 3000 },
    calibrationReference: `CAL-${identifier}`,
    calibrationDueDate: addDays(todayIsoDate(), dueInDays),
  };
}

describe('POST /api/equipment', () => {
  it('registers each kind with its values, and records equipment.created', async () => {
    const bodies = [
      camera(`CAM-${suffix}`),
      {
        kind: 'target',
        identifier: `TGT-${suffix}`,
        values: { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.0015, polarity: 'dark-on-light' },
        calibrationReference: 'CAL-T',
        calibrationDueDate: '2099-01-31',
      },
      { kind: 'rail-scale', identifier: `RAIL-${suffix}`, values: { uncertaintyMm: 0.02 }, calibrationReference: 'CAL-R', calibrationDueDate: '2099-01-31' },
      {
        kind: 'collimator',
        identifier: `COL-${suffix}`,
        values: { focalLengthMm: 400, focalLengthUncertaintyMm: 0.4 },
        calibrationReference: 'CAL-C',
        calibrationDueDate: '2099-01-31',
      },
      {
        kind: 'auxiliary-lens',
        identifier: `AUX-${suffix}`,
        values: { focalLengthMm: 75, focalLengthUncertaintyMm: 0 },
        calibrationReference: 'CAL-A',
        calibrationDueDate: '2099-01-31',
      },
    ];
    for (const body of bodies) {
      const response = await sendJson(admin, 'post', '/api/equipment', body);
      expect(response.status, JSON.stringify(response.body)).toBe(201);
      expect(response.body.equipment).toMatchObject({ kind: body.kind, identifier: body.identifier, values: body.values, active: true });
      const event = await latestAuditEvent(testApp.deps.db, 'equipment.created', response.body.equipment.id);
      expect(event).toMatchObject({ actorId: admin.person.id, details: { identifier: body.identifier } });
    }
    expect((await sendJson(admin, 'post', '/api/equipment', bodies[1])).body).toEqual({
      error: {
        message: `Equipment with the identifier "TGT-${suffix}" is already in the register; give this item its own identifier.`,
        fields: { identifier: `Equipment with the identifier "TGT-${suffix}" is already in the register; give this item its own identifier.` },
      },
    });
  });

  it('answers a duplicate identifier, in any letter case, with 409 and a sentence', async () => {
    const identifier = `CAM-DUP-${suffix}`;
    expect((await sendJson(admin, 'post', '/api/equipment', camera(identifier))).status).toBe(201);
    const again = await sendJson(admin, 'post', '/api/equipment', camera(identifier.toLowerCase()));
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe(
      `Equipment with the identifier "${identifier.toLowerCase()}" is already in the register; give this item its own identifier.`,
    );
  });

  it('checks values per kind and names each bad value', async () => {
    const post = (body: object) => sendJson(admin, 'post', '/api/equipment', { identifier: `BAD-${uniqueSuffix()}`, calibrationReference: 'R', calibrationDueDate: '2099-01-01', ...body });

    const badCamera = await post({ kind: 'camera', values: { pixelPitchUm: 0, pixelPitchUncertaintyUm: -0.1, widthPx: 10.5 } });
    expect(badCamera.status).toBe(400);
    expect(badCamera.body.error.fields).toEqual({
      'values.pixelPitchUm': 'Field "values.pixelPitchUm" must be greater than 0 µm.',
      'values.pixelPitchUncertaintyUm': 'Field "values.pixelPitchUncertaintyUm" must be 0 µm or more.',
      'values.widthPx': 'Field "values.widthPx" must be a whole number of pixels.',
    });

    const badTarget = await post({ kind: 'target', values: { pattern: 'crosshair', sizeMm: -6, polarity: 'grey' } });
    expect(badTarget.body.error.fields).toEqual({
      'values.pattern': 'Field "values.pattern" must be "dot-pair" or "square".',
      'values.sizeMm': 'Field "values.sizeMm" must be greater than 0 mm.',
      'values.sizeUncertaintyMm': 'Field "values.sizeUncertaintyMm" must be a number (mm).',
      'values.polarity': 'Field "values.polarity" must be "dark-on-light" or "light-on-dark".',
    });

    const badRail = await post({ kind: 'rail-scale', values: { uncertaintyMm: -0.01, lengthMm: 0 } });
    expect(badRail.body.error.fields).toEqual({
      'values.uncertaintyMm': 'Field "values.uncertaintyMm" must be 0 mm or more.',
      'values.lengthMm': 'Field "values.lengthMm" must be greater than 0 mm.',
    });

    const badCollimator = await post({ kind: 'collimator', values: { focalLengthMm: -400, focalLengthUncertaintyMm: 0.4 } });
    expect(badCollimator.body.error.fields).toEqual({ 'values.focalLengthMm': 'Field "values.focalLengthMm" must be greater than 0 mm.' });

    const cameraValuesOnLens = await post({ kind: 'auxiliary-lens', values: { focalLengthMm: 75, focalLengthUncertaintyMm: 0.1, pixelPitchUm: 3.45 } });
    expect(cameraValuesOnLens.body.error.fields).toEqual({
      values: 'Field "values" has field(s) that a collimator or auxiliary lens does not take: pixelPitchUm.',
    });

    const noValues = await post({ kind: 'camera' });
    expect(noValues.body.error.fields).toEqual({ values: 'Field "values" must be an object of the values this kind of equipment carries.' });

    const badKind = await post({ kind: 'laser', values: {} });
    expect(badKind.body.error.fields).toEqual({ kind: 'Field "kind" must be one of: camera, target, rail-scale, collimator, auxiliary-lens.' });

    const badDate = await post({ kind: 'rail-scale', values: { uncertaintyMm: 0.02 }, calibrationDueDate: '2026-04-31' });
    expect(badDate.body.error.fields).toEqual({
      calibrationDueDate: 'Field "calibrationDueDate" must be a real date written YYYY-MM-DD (e.g. 2026-03-31).',
    });
  });
});

describe('GET /api/equipment', () => {
  it('lists items with their calibration state, filters by kind and text, and hides retired items unless asked', async () => {
    const tag = `LST-${uniqueSuffix()}`;
    const made: Record<string, EquipmentItem> = {};
    for (const [name, days] of [
      ['current', 120],
      ['soon', 10],
      ['today', 0],
      ['overdue', -1],
    ] as const) {
      made[name] = (await sendJson(admin, 'post', '/api/equipment', camera(`${tag}-${name}`, days))).body.equipment;
    }
    const target = await sendJson(admin, 'post', '/api/equipment', {
      kind: 'target',
      identifier: `${tag}-target`,
      values: { pattern: 'square', sizeMm: 4, sizeUncertaintyMm: 0.001 },
      calibrationReference: `REF ${tag} 50%_off`,
      calibrationDueDate: '2099-12-31',
    });
    expect(target.status).toBe(201);

    const response = await technician.agent.get('/api/equipment').query({ q: tag });
    expect(response.status).toBe(200);
    const byIdentifier = new Map(response.body.items.map((item: EquipmentItem) => [item.identifier, item]));
    expect(byIdentifier.size).toBe(5);
    expect(byIdentifier.get(`${tag}-current`)).toMatchObject({ calibrationState: 'current', daysUntilCalibrationDue: 120 });
    expect(byIdentifier.get(`${tag}-soon`)).toMatchObject({ calibrationState: 'due-soon', daysUntilCalibrationDue: 10 });
    expect(byIdentifier.get(`${tag}-today`)).toMatchObject({ calibrationState: 'due-soon', daysUntilCalibrationDue: 0 });
    expect(byIdentifier.get(`${tag}-overdue`)).toMatchObject({ calibrationState: 'overdue', daysUntilCalibrationDue: -1 });

    const cameras = await technician.agent.get('/api/equipment').query({ q: tag, kind: 'camera' });
    expect(cameras.body.items.map((item: EquipmentItem) => item.kind)).toEqual(['camera', 'camera', 'camera', 'camera']);
    const literal = await technician.agent.get('/api/equipment').query({ q: `${tag} 50%_off` });
    expect(literal.body.items.map((item: EquipmentItem) => item.identifier)).toEqual([`${tag}-target`]);
    expect((await technician.agent.get('/api/equipment').query({ q: `${tag} 50%Xoff` })).body.items).toEqual([]);

    const retired = await sendJson(admin, 'patch', `/api/equipment/${made.overdue.id}`, { active: false });
    expect(retired.body.equipment.active).toBe(false);
    const activeOnly = await technician.agent.get('/api/equipment').query({ q: tag });
    expect(activeOnly.body.items.map((item: EquipmentItem) => item.id)).not.toContain(made.overdue.id);
    const withRetired = await technician.agent.get('/api/equipment').query({ q: tag, includeInactive: 'true' });
    expect(withRetired.body.items.map((item: EquipmentItem) => item.id)).toContain(made.overdue.id);

    const bad = await technician.agent.get('/api/equipment').query({ kind: 'lamp', includeInactive: 'yes' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toEqual({
      kind: 'Field "kind" must be one of: camera, target, rail-scale, collimator, auxiliary-lens.',
      includeInactive: 'Field "includeInactive" must be true or false.',
    });
  });
});

describe('PATCH /api/equipment/:equipmentId', () => {
  it('changes fields, replaces values checked against the stored kind, and records equipment.updated', async () => {
    const created = (await sendJson(admin, 'post', '/api/equipment', camera(`PATCH-${uniqueSuffix()}`))).body.equipment as EquipmentItem;
    const response = await sendJson(admin, 'patch', `/api/equipment/${created.id}`, {
      values: { pixelPitchUm: 5.86, pixelPitchUncertaintyUm: 0.01 },
      calibrationReference: 'CAL-NEW',
      calibrationDueDate: '2099-06-30',
    });
    expect(response.status).toBe(200);
    expect(response.body.equipment).toMatchObject({
      values: { pixelPitchUm: 5.86, pixelPitchUncertaintyUm: 0.01 },
      calibrationReference: 'CAL-NEW',
      calibrationDueDate: '2099-06-30',
      calibrationState: 'current',
    });
    const event = await latestAuditEvent(testApp.deps.db, 'equipment.updated', created.id);
    expect(event.details).toMatchObject({
      changedFields: ['values', 'calibrationReference', 'calibrationDueDate'],
      after: { calibrationReference: 'CAL-NEW' },
      retired: false,
    });

    const badValues = await sendJson(admin, 'patch', `/api/equipment/${created.id}`, { values: { focalLengthMm: 100, focalLengthUncertaintyMm: 0.1 } });
    expect(badValues.status).toBe(400);
    expect(badValues.body.error.fields).toEqual({
      'values.pixelPitchUm': 'Field "values.pixelPitchUm" must be a number (µm).',
      'values.pixelPitchUncertaintyUm': 'Field "values.pixelPitchUncertaintyUm" must be a number (µm).',
      values: 'Field "values" has field(s) that a camera does not take: focalLengthMm, focalLengthUncertaintyMm.',
    });

    const kindChange = await sendJson(admin, 'patch', `/api/equipment/${created.id}`, { kind: 'target' });
    expect(kindChange.body.error.fields).toEqual({
      kind: 'Field "kind" cannot change (this item is a camera); register the new item separately.',
    });
  });

  it('answers a clash of identifiers with 409, an empty change with 400 and an unknown id with 404', async () => {
    const first = (await sendJson(admin, 'post', '/api/equipment', camera(`ONE-${uniqueSuffix()}`))).body.equipment as EquipmentItem;
    const second = (await sendJson(admin, 'post', '/api/equipment', camera(`TWO-${uniqueSuffix()}`))).body.equipment as EquipmentItem;
    const clash = await sendJson(admin, 'patch', `/api/equipment/${second.id}`, { identifier: first.identifier });
    expect(clash.status).toBe(409);
    expect((await sendJson(admin, 'patch', `/api/equipment/${second.id}`, { identifier: second.identifier })).status).toBe(200);
    expect((await sendJson(admin, 'patch', `/api/equipment/${second.id}`, {})).body.error.message).toBe('Send at least one field to change.');
    const unknownId = '00000000-0000-4000-8000-000000000000';
    const missing = await sendJson(admin, 'patch', `/api/equipment/${unknownId}`, { active: false });
    expect(missing.status).toBe(404);
    expect(missing.body.error.message).toBe(`There is no equipment with id ${unknownId}.`);
  });
});
