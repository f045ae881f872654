import { mkdir, readdir } from 'node:fs/promises';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MeasurementError } from '../../../shared/measure/engine/measurement-error';
import { analysisRunStatuses } from '../../../shared/schemas/analyses';
import { analysisRuns, analysisRunStatusValues, frames, measurements } from '../../../server/db/schema';
import { measureFolder } from '../../../server/measure/measure-folder';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { requestAnalysisRun } from '../../../server/services/analysis-runs';
import { startAnalysisWorker, type RunningAnalysisWorker } from '../../../server/workers/analysis-worker';
import { cachedBenchMeasurement as benchFixture, type CachedBenchMeasurement as BenchFixture } from '../../../scripts/synth/cached-bench-measurement';
import { signedInWithRoles, startBrowserSession } from '../../helpers/browser-session';
import { uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import {
  analysisRunRow,
  createAnalysisBench,
  createMeasurementFromFixture,
  getAnalysis,
  requestAnalysis,
  waitForAnalysisToFinish,
  type AnalysisBench,
} from './analysis-bench';
import { smallFiniteConjugate, withoutTarget } from './small-bench';

// This file's own queue, so workers of other test files never take its jobs.
process.env.PARAXIA_ANALYSIS_QUEUE_NAME = `analyse-test-runs-${uniqueSuffix()}`;
process.env.PARAXIA_ANALYSIS_POLLING_SECONDS = '0.5';

let testApp: TestApp;
let bench: AnalysisBench;
let worker: RunningAnalysisWorker;
let scratchDir: string;
let fixture: BenchFixture;

beforeAll(async () => {
  testApp = createTestApp();
  bench = await createAnalysisBench(testApp);
  scratchDir = path.join(process.env.PARAXIA_TEST_SCRATCH_DIR ?? '/tmp', `analysis-runs-${uniqueSuffix()}`);
  await mkdir(scratchDir, { recursive: true });
  worker = await startAnalysisWorker({ env: testApp.deps.env, scratchDir });
  fixture = await benchFixture('finite-conjugate', (s) => smallFiniteConjugate(s));
});

afterAll(async () => {
  await worker?.stop();
  await testApp?.close();
});

async function measurementRow(measurementId: string) {
  const [row] = await testApp.deps.db.select().from(measurements).where(eq(measurements.id, measurementId));
  return row;
}

describe('analysis run statuses', () => {
  it('are the same words in the shared contract and the database enum', () => {
    expect([...analysisRunStatuses]).toEqual([...analysisRunStatusValues]);
  });
});

describe('POST /api/measurements/:id/analyses with a worker running', () => {
  it('queues version 1, which the worker finishes within 0.5 % of the generator’s focal length, with every frame counted', async () => {
    const { measurementId } = await createMeasurementFromFixture(testApp, bench, fixture);
    const queued = await requestAnalysis(bench, measurementId);
    expect(queued).toMatchObject({ version: 1, status: 'queued', phase: 'waiting', framesDone: 0, framesTotal: 15 });
    expect(queued).not.toHaveProperty('result');
    expect(queued.requestedBy).toEqual({ id: bench.technician.person.id, name: bench.technician.person.name });
    expect((await measurementRow(measurementId)).status).toBe('analysing');

    const { final, seen } = await waitForAnalysisToFinish(bench.technician, measurementId, 1, { timeoutMs: 90_000 });
    expect(final.status, final.errorMessage ?? '').toBe('succeeded');
    expect(final.framesDone).toBe(final.framesTotal);
    expect(final.framesTotal).toBe(15);
    // The progress view never carries the result document or the manifest.
    for (const summary of seen) expect(Object.keys(summary)).not.toContain('result');
    for (const summary of seen) expect(Object.keys(summary)).not.toContain('manifest');

    const run = await getAnalysis(bench.technician, measurementId, 1);
    const truthMm = fixture.truth.focalLengthMm;
    expect(run.result).not.toBeNull();
    expect(Math.abs(run.result!.focalLengthMm - truthMm) / truthMm).toBeLessThan(0.005);
    expect(run.focalLengthMm).toBe(run.result!.focalLengthMm);
    expect(run.expandedUncertaintyMm).toBe(run.result!.expandedUncertaintyMm);
    expect(run.manifest.method).toBe('finite-conjugate');
    expect(run.manifest.sweeps[0].frames).toHaveLength(15);
    expect(run.startedAt).not.toBeNull();
    expect(run.finishedAt).not.toBeNull();

    const measurement = await measurementRow(measurementId);
    expect(measurement.status).toBe('analysed');
    expect(measurement.currentAnalysisId).toBe(run.id);
    expect((await analysisRunRow(testApp, run.id)).attempts).toBe(1);
    // The worker removes each job's temporary folder.
    expect(await readdir(scratchDir)).toEqual([]);

    // A re-run adds version 2 and leaves version 1 exactly as it was.
    const versionOneBefore = await getAnalysis(bench.technician, measurementId, 1);
    const second = await requestAnalysis(bench, measurementId);
    expect(second.version).toBe(2);
    expect(second.id).not.toBe(run.id);
    const secondFinal = await waitForAnalysisToFinish(bench.technician, measurementId, 2, { timeoutMs: 90_000 });
    expect(secondFinal.final.status).toBe('succeeded');
    expect(await getAnalysis(bench.technician, measurementId, 1)).toEqual(versionOneBefore);
    expect((await measurementRow(measurementId)).currentAnalysisId).toBe(second.id);

    const detail = await bench.technician.agent.get(`/api/measurements/${measurementId}`);
    expect(detail.status).toBe(200);
    expect(detail.body.measurement.currentAnalysis.version).toBe(2);
    expect(detail.body.measurement.analyses.map((a: { version: number }) => a.version).sort()).toEqual([1, 2]);
  });

  it('ends a run whose frames show no target as failed with the engine’s own sentence, and the measurement analysis-failed', async () => {
    const noTarget = await benchFixture('finite-conjugate', (s) => withoutTarget(smallFiniteConjugate(s, { seed: 41 })));
    let engineSentence = '';
    try {
      await measureFolder(noTarget.folder);
    } catch (error) {
      expect(error).toBeInstanceOf(MeasurementError);
      engineSentence = (error as MeasurementError).message;
    }
    expect(engineSentence).not.toBe('');

    const { measurementId } = await createMeasurementFromFixture(testApp, bench, noTarget);
    await requestAnalysis(bench, measurementId);
    const { final } = await waitForAnalysisToFinish(bench.technician, measurementId, 1, { timeoutMs: 90_000 });
    expect(final.status).toBe('failed');
    expect(final.phase).toBe('failed');
    expect(final.errorMessage).toBe(engineSentence);
    const run = await getAnalysis(bench.technician, measurementId, 1);
    expect(run.result).toBeNull();
    // A user problem is not retried.
    expect((await analysisRunRow(testApp, run.id)).attempts).toBe(1);
    expect((await measurementRow(measurementId)).status).toBe('analysis-failed');
  });
});

describe('POST /api/measurements/:id/analyses refusals', () => {
  let measurementId: string;

  beforeAll(async () => {
    ({ measurementId } = await createMeasurementFromFixture(testApp, bench, fixture));
  });

  it('answers 400 naming the sweep when a frame has no reading, and writes nothing', async () => {
    const frame = (await bench.technician.agent.get(`/api/measurements/${measurementId}`)).body.measurement.sweeps[0].frames[0];
    const runsBefore = await testApp.deps.db.$count(analysisRuns, eq(analysisRuns.measurementId, measurementId));
    // The readings route never leaves a frame without a reading, so the gap is made in the table directly.
    await testApp.deps.db.update(frames).set({ positionMm: null }).where(eq(frames.id, frame.id));
    const response = await bench.technician.agent
      .post(`/api/measurements/${measurementId}/analyses`)
      .set(CSRF_HEADER_NAME, bench.technician.csrfToken)
      .send({});
    expect(response.status).toBe(400);
    expect(Object.keys(response.body.error.fields)).toEqual(['sweeps[0]']);
    expect(response.body.error.fields['sweeps[0]']).toContain(frame.fileName);
    expect(await testApp.deps.db.$count(analysisRuns, eq(analysisRuns.measurementId, measurementId))).toBe(runsBefore);
    expect((await measurementRow(measurementId)).status).toBe('draft');
    await testApp.deps.db.update(frames).set({ positionMm: frame.positionMm }).where(eq(frames.id, frame.id));
  });

  it('refuses with 409 once the measurement is submitted, approved or certified', async () => {
    for (const status of ['submitted', 'approved', 'certified'] as const) {
      await testApp.deps.db.update(measurements).set({ status }).where(eq(measurements.id, measurementId));
      const response = await bench.technician.agent
        .post(`/api/measurements/${measurementId}/analyses`)
        .set(CSRF_HEADER_NAME, bench.technician.csrfToken)
        .send({});
      expect(response.status, status).toBe(409);
      expect(response.body.error.message).toMatch(new RegExp(`has been ${status}|submitted for review`));
    }
    expect(await testApp.deps.db.$count(analysisRuns, eq(analysisRuns.measurementId, measurementId))).toBe(0);
    await testApp.deps.db.update(measurements).set({ status: 'draft' }).where(eq(measurements.id, measurementId));
  });

  it('marks the run failed with a sentence and answers 503 when the queue cannot take the job', async () => {
    const error = await requestAnalysisRun(
      { ...testApp.deps, queue: () => Promise.reject(new Error('connection refused')) },
      { measurementId, requestedById: bench.technician.person.id },
    ).catch((e: unknown) => e);
    expect(error).toMatchObject({ status: 503 });
    expect((error as Error).message).toMatch(/could not be queued/);
    const run = await getAnalysis(bench.technician, measurementId, 1);
    expect(run.status).toBe('failed');
    expect(run.errorMessage).toMatch(/could not be queued/);
    expect((await measurementRow(measurementId)).status).toBe('analysis-failed');
  });

  it('refuses a second request with 409 while a run is still queued or running', async () => {
    // The measurement is analysis-failed from the test above; this file's worker is stopped meanwhile so the run stays queued.
    await worker.stop();
    const first = await requestAnalysis(bench, measurementId);
    expect(first.status).toBe('queued');
    const response = await bench.technician.agent
      .post(`/api/measurements/${measurementId}/analyses`)
      .set(CSRF_HEADER_NAME, bench.technician.csrfToken)
      .send({});
    expect(response.status).toBe(409);
    expect(response.body.error.message).toMatch(/already being analysed/);
  });
});

describe('analysis routes by role', () => {
  let measurementId: string;

  beforeAll(async () => {
    ({ measurementId } = await createMeasurementFromFixture(testApp, bench, fixture));
  });

  it('lets only a technician request an analysis; anonymous visitors get 401', async () => {
    for (const role of ['reviewer', 'admin', 'client'] as const) {
      const session = await signedInWithRoles(testApp, [role]);
      const response = await session.agent.post(`/api/measurements/${measurementId}/analyses`).set(CSRF_HEADER_NAME, session.csrfToken).send({});
      expect(response.status, role).toBe(403);
    }
    const anonymous = await startBrowserSession(testApp.app);
    const response = await anonymous.agent.post(`/api/measurements/${measurementId}/analyses`).set(CSRF_HEADER_NAME, anonymous.csrfToken).send({});
    expect(response.status).toBe(401);
    expect(await testApp.deps.db.$count(analysisRuns, eq(analysisRuns.measurementId, measurementId))).toBe(0);
    const allowed = await requestAnalysis(bench, measurementId);
    expect(allowed.version).toBe(1);
  });

  it('lets technicians, reviewers and admins read a version, not clients; anonymous visitors get 401', async () => {
    for (const role of ['technician', 'reviewer', 'admin'] as const) {
      const session = await signedInWithRoles(testApp, [role]);
      const full = await session.agent.get(`/api/measurements/${measurementId}/analyses/1`);
      expect(full.status, role).toBe(200);
      expect(full.body.analysis).toHaveProperty('manifest');
      const progress = await session.agent.get(`/api/measurements/${measurementId}/analyses/1?fields=progress`);
      expect(progress.status, role).toBe(200);
      expect(progress.body.analysis).not.toHaveProperty('manifest');
    }
    const client = await signedInWithRoles(testApp, ['client']);
    expect((await client.agent.get(`/api/measurements/${measurementId}/analyses/1`)).status).toBe(403);
    const anonymous = await startBrowserSession(testApp.app);
    expect((await anonymous.agent.get(`/api/measurements/${measurementId}/analyses/1`)).status).toBe(401);
  });

  it('answers 404 with a sentence for a version or measurement that does not exist, and 400 for a bad version', async () => {
    const missingVersion = await bench.technician.agent.get(`/api/measurements/${measurementId}/analyses/7`);
    expect(missingVersion.status).toBe(404);
    expect(missingVersion.body.error.message).toMatch(/has no analysis version 7\.$/);
    const missingMeasurement = await bench.technician.agent.get('/api/measurements/00000000-0000-4000-8000-000000000000/analyses/1');
    expect(missingMeasurement.status).toBe(404);
    const badVersion = await bench.technician.agent.get(`/api/measurements/${measurementId}/analyses/first`);
    expect(badVersion.status).toBe(400);
    expect(badVersion.body.error.fields.version).toBe('Field "version" must be a whole number of 1 or more.');
    const badFields = await bench.technician.agent.get(`/api/measurements/${measurementId}/analyses/1?fields=everything`);
    expect(badFields.status).toBe(400);
  });
});
