import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, frames, measurements } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestBench, createTestLens, createTestWorkOrder, finiteConjugateBody } from './bench-records';
import { readUploadFixture } from './upload-fixtures';

let testApp: TestApp;
let technician: SignedInSession;
let measurementId: string;
let sweepId: string;
/** Uploaded in this order on purpose: natural order differs from upload and from plain text order. */
const FILE_NAMES = ['frame10.png', 'frame2.png', 'frame1.png', 'frame9.png', 'frame3.png'];

beforeAll(async () => {
  testApp = createTestApp();
  technician = await signedInWithRoles(testApp, ['technician']);
  const bench = await createTestBench(testApp.deps);
  const { workOrder } = await createTestWorkOrder(testApp.deps);
  const lens = await createTestLens(testApp.deps, workOrder.id);
  const created = await technician.agent.post('/api/measurements').set(CSRF_HEADER_NAME, technician.csrfToken).send(finiteConjugateBody(lens.id, bench));
  measurementId = created.body.measurement.id;
  sweepId = created.body.measurement.sweeps[0].id;
  const content = await readUploadFixture('dot-pair-8bit.png');
  for (const name of FILE_NAMES) {
    const response = await technician.agent
      .post(`/api/sweeps/${sweepId}/frames`)
      .set(CSRF_HEADER_NAME, technician.csrfToken)
      .attach('frame', content, { filename: name });
    expect(response.status).toBe(201);
  }
});

afterAll(async () => {
  await testApp?.close();
});

function putReadings(body: object) {
  return technician.agent.put(`/api/sweeps/${sweepId}/readings`).set(CSRF_HEADER_NAME, technician.csrfToken).send(body);
}

async function storedReadings(): Promise<Record<string, number | null>> {
  const rows = await testApp.deps.db.select().from(frames).where(eq(frames.sweepId, sweepId));
  return Object.fromEntries(rows.map((row) => [row.fileName, row.positionMm]));
}

describe('PUT /api/sweeps/:sweepId/readings', () => {
  it('start-step: numbers the frames in natural file-name order (frame2 before frame10)', async () => {
    const response = await putReadings({ mode: 'start-step', startMm: 447, stepMm: 0.25 });
    expect(response.status).toBe(200);
    expect(response.body.frames.map((f: { fileName: string; positionMm: number }) => [f.fileName, f.positionMm])).toEqual([
      ['frame1.png', 447],
      ['frame2.png', 447.25],
      ['frame3.png', 447.5],
      ['frame9.png', 447.75],
      ['frame10.png', 448],
    ]);
    expect(await storedReadings()).toEqual({ 'frame1.png': 447, 'frame2.png': 447.25, 'frame3.png': 447.5, 'frame9.png': 447.75, 'frame10.png': 448 });
    const events = await testApp.deps.db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.subjectId, measurementId), eq(auditEvents.action, 'sweep.readings-set')));
    expect(events.at(-1)?.details).toMatchObject({ sweepId, mode: 'start-step', frames: 5 });
  });

  it('table: sets each frame from its row', async () => {
    const rows = FILE_NAMES.map((fileName, i) => ({ fileName, positionMm: 500 - i }));
    const response = await putReadings({ mode: 'table', rows });
    expect(response.status).toBe(200);
    expect(await storedReadings()).toEqual({ 'frame10.png': 500, 'frame2.png': 499, 'frame1.png': 498, 'frame9.png': 497, 'frame3.png': 496 });
  });

  it('text: parses pasted two-column text with a header, semicolons and decimal commas', async () => {
    const text = ['Datei;Position', 'frame1.png;450,1', 'frame2.png;450,2', 'frame3.png;450,3', 'frame9.png;450,9', 'frame10.png;451,0'].join('\r\n');
    const response = await putReadings({ mode: 'text', text });
    expect(response.status).toBe(200);
    expect(await storedReadings()).toEqual({ 'frame1.png': 450.1, 'frame2.png': 450.2, 'frame3.png': 450.3, 'frame9.png': 450.9, 'frame10.png': 451 });
  });

  describe('refuses, changing nothing', () => {
    let before: Record<string, number | null>;
    beforeAll(async () => {
      await putReadings({ mode: 'start-step', startMm: 10, stepMm: 1 });
      before = await storedReadings();
    });

    it('a table with a duplicated file, an unknown file and a missing frame, naming each file', async () => {
      const response = await putReadings({
        mode: 'table',
        rows: [
          { fileName: 'frame1.png', positionMm: 1 },
          { fileName: 'frame2.png', positionMm: 2 },
          { fileName: 'frame2.png', positionMm: 2.5 },
          { fileName: 'frame3.png', positionMm: 3 },
          { fileName: 'frame4.png', positionMm: 4 },
          { fileName: 'frame9.png', positionMm: 9 },
        ],
      });
      expect(response.status).toBe(400);
      expect(response.body.error.fields).toEqual({
        'frame4.png': 'frame4.png (row 5) is not a frame of this sweep.',
        'frame2.png': 'frame2.png has 2 readings (rows 2 and 3); give exactly one.',
        'frame10.png': 'frame10.png has no reading.',
      });
      expect(response.body.error.message).toBe('The readings were not saved: frame4.png (row 5) is not a frame of this sweep. (and 2 more problems)');
      expect(await storedReadings()).toEqual(before);
    });

    it('a table row whose reading is not a number, naming the row', async () => {
      const rows = FILE_NAMES.map((fileName) => ({ fileName, positionMm: 1 }));
      const response = await putReadings({ mode: 'table', rows: [...rows.slice(0, 4), { fileName: 'frame3.png', positionMm: '4x7' }] });
      expect(response.status).toBe(400);
      expect(response.body.error.fields['rows.4.positionMm']).toBe('Field "positionMm" must be a number (mm).');
      expect(await storedReadings()).toEqual(before);
    });

    it('text with garbage, naming the line, and the frames it then leaves without a reading', async () => {
      const text = ['frame1.png,1', 'frame2.png,two', 'frame3.png,3', 'frame9.png,9', 'frame10.png,10', 'frame3.png,3.5'].join('\n');
      const response = await putReadings({ mode: 'text', text });
      expect(response.status).toBe(400);
      expect(response.body.error.fields).toEqual({
        'line 2': 'Line 2: the reading "two" for frame2.png is not a number.',
        'frame2.png': 'frame2.png has no reading.',
        'frame3.png': 'frame3.png has 2 readings (lines 3 and 6); give exactly one.',
      });
      expect(await storedReadings()).toEqual(before);
    });

    it('empty text, a zero step and an unknown mode', async () => {
      expect((await putReadings({ mode: 'text', text: '\n# nothing yet\n' })).body.error.message).toBe(
        'The readings were not saved: The text holds no readings: give one line per frame, the file name and the rail reading (mm).',
      );
      expect((await putReadings({ mode: 'start-step', startMm: 1, stepMm: 0 })).body.error.fields).toEqual({ stepMm: 'Field "stepMm" must not be zero.' });
      expect((await putReadings({ mode: 'guess' })).body.error.fields).toEqual({ mode: 'Field "mode" must be one of: start-step, table, text.' });
      expect(await storedReadings()).toEqual(before);
    });

    it('any change once the measurement is submitted (409)', async () => {
      await testApp.deps.db.update(measurements).set({ status: 'submitted' }).where(eq(measurements.id, measurementId));
      try {
        const response = await putReadings({ mode: 'start-step', startMm: 0, stepMm: 1 });
        expect(response.status).toBe(409);
        expect(response.body.error.message).toMatch(/is submitted, so its frames can no longer change \(changing readings is refused\)\.$/);
        expect(await storedReadings()).toEqual(before);
      } finally {
        await testApp.deps.db.update(measurements).set({ status: 'draft' }).where(eq(measurements.id, measurementId));
      }
    });
  });

  it('refuses readings for a sweep without frames, and answers 404 for an unknown sweep', async () => {
    const added = await technician.agent
      .post(`/api/measurements/${measurementId}/sweeps`)
      .set(CSRF_HEADER_NAME, technician.csrfToken)
      .send({ moving: 'sensor', objectPositionMm: 20, lensPositionMm: 330 });
    const empty = await technician.agent
      .put(`/api/sweeps/${added.body.sweep.id}/readings`)
      .set(CSRF_HEADER_NAME, technician.csrfToken)
      .send({ mode: 'start-step', startMm: 0, stepMm: 1 });
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toBe('Sweep 2 has no frames yet; upload its frames before giving readings.');
    const unknown = await technician.agent
      .put('/api/sweeps/00000000-0000-4000-8000-000000000000/readings')
      .set(CSRF_HEADER_NAME, technician.csrfToken)
      .send({ mode: 'start-step', startMm: 0, stepMm: 1 });
    expect(unknown.status).toBe(404);
  });
});
