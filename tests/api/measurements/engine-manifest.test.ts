import { Readable } from 'node:stream';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkMeasurementManifest } from '../../../shared/schemas/measurement-manifest';
import { frames } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { buildEngineManifest } from '../../../server/services/engine-manifest';
import { storeFrameFromStream } from '../../../server/services/frame-storage';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestBench, createTestLens, createTestWorkOrder, finiteConjugateBody, type TestBench } from './bench-records';
import { readUploadFixture } from './upload-fixtures';

let testApp: TestApp;
let technician: SignedInSession;
let bench: TestBench;
let workOrderId: string;
let png: Buffer;

beforeAll(async () => {
  testApp = createTestApp();
  technician = await signedInWithRoles(testApp, ['technician']);
  bench = await createTestBench(testApp.deps);
  workOrderId = (await createTestWorkOrder(testApp.deps)).workOrder.id;
  png = await readUploadFixture('dot-pair-8bit.png');
});

afterAll(async () => {
  await testApp?.close();
});

async function createMeasurement(body: object) {
  const response = await technician.agent.post('/api/measurements').set(CSRF_HEADER_NAME, technician.csrfToken).send(body);
  expect(response.status).toBe(201);
  return response.body.measurement as { id: string; number: string; sweeps: { id: string }[] };
}

async function addFrames(sweepId: string, names: string[]) {
  const stored = [];
  for (const fileName of names) stored.push(await storeFrameFromStream(testApp.deps, { sweepId, fileName, stream: Readable.from([png]) }));
  return stored;
}

function putStartStep(sweepId: string, startMm: number, stepMm: number) {
  return technician.agent.put(`/api/sweeps/${sweepId}/readings`).set(CSRF_HEADER_NAME, technician.csrfToken).send({ mode: 'start-step', startMm, stepMm });
}

describe('buildEngineManifest', () => {
  it('turns a multi-conjugate measurement into the engine manifest: equipment values, sweeps, readings, exclusions, lens block, focus operator', async () => {
    const lens = await createTestLens(testApp.deps, workOrderId, { nominalFocalLengthMm: 100, tolerancePercent: 2, toleranceMm: 1.5 });
    const m = await createMeasurement({
      ...finiteConjugateBody(lens.id, bench),
      method: 'multi-conjugate',
      focusOperator: 'brenner',
      sweeps: [
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 250 },
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 400 },
      ],
    });
    const [first, second] = m.sweeps;
    const firstFrames = await addFrames(first.id, ['f10.png', 'f2.png', 'f1.png', 'f3.png', 'f4.png', 'f5.png']);
    await addFrames(second.id, ['a.png', 'b.png', 'c.png', 'd.png', 'e.png']);
    expect((await putStartStep(first.id, 415, 0.5)).status).toBe(200);
    expect((await putStartStep(second.id, 560, 0.25)).status).toBe(200);
    const excluded = firstFrames.find((f) => f.fileName === 'f3.png')!;
    await technician.agent.patch(`/api/frames/${excluded.id}`).set(CSRF_HEADER_NAME, technician.csrfToken).send({ excluded: true });

    const { manifest, files } = await buildEngineManifest(testApp.deps.db, m.id);
    expect(manifest).toEqual({
      method: 'multi-conjugate',
      camera: { pixelPitchUm: 3.45, pixelPitchUncertaintyUm: 0.01 },
      target: { pattern: 'dot-pair', sizeMm: 6, sizeUncertaintyMm: 0.002, polarity: 'dark-on-light' },
      scale: { uncertaintyMm: 0.02 },
      sweeps: [
        {
          moving: 'sensor',
          objectPositionMm: 0,
          lensPositionMm: 250,
          sensorPositionMm: undefined,
          frames: [
            { file: 's1/f1.png', positionMm: 415 },
            { file: 's1/f2.png', positionMm: 415.5 },
            { file: 's1/f3.png', positionMm: 416 },
            { file: 's1/f4.png', positionMm: 416.5 },
            { file: 's1/f5.png', positionMm: 417 },
            { file: 's1/f10.png', positionMm: 417.5 },
          ],
        },
        {
          moving: 'sensor',
          objectPositionMm: 0,
          lensPositionMm: 400,
          sensorPositionMm: undefined,
          frames: ['a', 'b', 'c', 'd', 'e'].map((name, i) => ({ file: `s2/${name}.png`, positionMm: 560 + i * 0.25 })),
        },
      ],
      // ± 2 % of 100 mm is ± 2 mm; the engine takes one band, the tighter ± 1.5 mm.
      lens: { nominalFocalLengthMm: 100, toleranceMm: 1.5, decisionRule: 'guarded' },
      analysis: { focusOperator: 'brenner', excludedFiles: ['s1/f3.png'] },
    });
    expect(checkMeasurementManifest(JSON.parse(JSON.stringify(manifest))).ok).toBe(true);

    const rows = await testApp.deps.db.select().from(frames).where(eq(frames.sweepId, first.id));
    const keyOf = new Map(rows.map((r) => [`s1/${r.fileName}`, r.objectKey]));
    expect(files).toHaveLength(11);
    for (const { file, objectKey } of files.filter((f) => f.file.startsWith('s1/'))) expect(objectKey).toBe(keyOf.get(file));
    for (const { objectKey } of files) expect(await testApp.deps.storage.headObject(objectKey)).not.toBeNull();
  });

  it('gives the collimator\'s values and no object position for the collimator method', async () => {
    const lens = await createTestLens(testApp.deps, workOrderId, { nominalFocalLengthMm: 50, tolerancePercent: null, toleranceMm: 0.5 });
    const m = await createMeasurement({
      ...finiteConjugateBody(lens.id, bench),
      method: 'collimator',
      collimatorId: bench.collimator.id,
      sweeps: [{ moving: 'sensor', lensPositionMm: 120 }],
    });
    await addFrames(m.sweeps[0].id, ['1.png', '2.png', '3.png', '4.png', '5.png']);
    await putStartStep(m.sweeps[0].id, 168, 0.1);
    const { manifest } = await buildEngineManifest(testApp.deps.db, m.id);
    expect(manifest.collimator).toEqual({ focalLengthMm: 400, focalLengthUncertaintyMm: 0.4 });
    expect(manifest.auxiliaryLens).toBeUndefined();
    expect(manifest.sweeps[0].objectPositionMm).toBeUndefined();
    expect(manifest.lens).toEqual({ nominalFocalLengthMm: 50, toleranceMm: 0.5, decisionRule: 'guarded' });
    expect(checkMeasurementManifest(JSON.parse(JSON.stringify(manifest))).ok).toBe(true);
  });

  it('refuses with 400 naming the sweep when a frame in use lacks a reading or fewer than 5 frames in use have one', async () => {
    const lens = await createTestLens(testApp.deps, workOrderId);
    const m = await createMeasurement({
      ...finiteConjugateBody(lens.id, bench),
      method: 'multi-conjugate',
      sweeps: [
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 250 },
        { moving: 'sensor', objectPositionMm: 0, lensPositionMm: 400 },
      ],
    });
    const [first, second] = m.sweeps;
    await addFrames(first.id, ['1.png', '2.png', '3.png', '4.png', '5.png']);
    const secondFrames = await addFrames(second.id, ['1.png', '2.png', '3.png', '4.png', '5.png']);
    await putStartStep(first.id, 400, 1);

    await expect(buildEngineManifest(testApp.deps.db, m.id)).rejects.toMatchObject({
      status: 400,
      fields: { 'sweeps[1]': 'Sweep 2: 5 frames (1.png, 2.png, 3.png, 4.png, 5.png) have no rail reading; give readings or exclude them.' },
    });

    await putStartStep(second.id, 500, 1);
    await technician.agent.patch(`/api/frames/${secondFrames[0].id}`).set(CSRF_HEADER_NAME, technician.csrfToken).send({ excluded: true });
    await expect(buildEngineManifest(testApp.deps.db, m.id)).rejects.toMatchObject({
      status: 400,
      message: 'Sweep 2 has 4 frames in use with a reading; it needs at least 5.',
      fields: { 'sweeps[1]': 'Sweep 2 has 4 frames in use with a reading; it needs at least 5.' },
    });
  });
});
