/**
 * Helpers for the analysis tests: a bench set up through the API (equipment
 * by an admin; work order, lens, measurement, frames and readings by a
 * technician) from a folder made by the project's synthetic bench generator.
 */
import { spawn } from 'node:child_process';
import { readdir } from 'node:fs/promises';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { expect } from 'vitest';
import type { AnalysisRun, AnalysisRunSummary } from '../../../shared/schemas/analyses';
import { analysisRuns } from '../../../server/db/schema';
import { CSRF_HEADER_NAME } from '../../../server/middleware/csrf';
import { signedInWithRoles, type SignedInSession } from '../../helpers/browser-session';
import { cachedBenchMeasurement, type CachedBenchMeasurement as BenchFixture } from '../../../scripts/synth/cached-bench-measurement';
import { smallFiniteConjugate } from './small-bench';
import { createTestOrganisation, uniqueSuffix } from '../../helpers/people';
import type { TestApp } from '../../helpers/test-app';

export interface AnalysisBench {
  technician: SignedInSession;
  admin: SignedInSession;
  organisationId: string;
}

export async function createAnalysisBench(testApp: TestApp): Promise<AnalysisBench> {
  const organisation = await createTestOrganisation(testApp.deps, { kind: 'client' });
  return {
    technician: await signedInWithRoles(testApp, ['technician']),
    admin: await signedInWithRoles(testApp, ['admin']),
    organisationId: organisation.id,
  };
}

function oneYearFromToday(): string {
  const date = new Date();
  date.setUTCFullYear(date.getUTCFullYear() + 1);
  return date.toISOString().slice(0, 10);
}

async function createEquipment(bench: AnalysisBench, kind: string, values: Record<string, unknown>): Promise<string> {
  const response = await bench.admin.agent
    .post('/api/equipment')
    .set(CSRF_HEADER_NAME, bench.admin.csrfToken)
    .send({
      kind,
      identifier: `T-${kind}-${uniqueSuffix()}`,
      values,
      calibrationReference: `TEST-CAL-${uniqueSuffix()}`,
      calibrationDueDate: oneYearFromToday(),
    });
  expect(response.status, JSON.stringify(response.body)).toBe(201);
  return response.body.equipment.id as string;
}

export interface BenchMeasurement {
  measurementId: string;
  number: string;
  sweepIds: string[];
}

/**
 * Creates equipment, a work order, a lens and a measurement matching the
 * fixture's manifest, uploads every frame the manifest names through the
 * frame upload route, and gives the readings as a table.
 */
export async function createMeasurementFromFixture(
  testApp: TestApp,
  bench: AnalysisBench,
  fixture: BenchFixture,
  options: { nominalFocalLengthMm?: number; tolerancePercent?: number; uploadConcurrency?: number } = {},
): Promise<BenchMeasurement> {
  const { manifest } = fixture;
  const tech = bench.technician;
  const cameraId = await createEquipment(bench, 'camera', {
    pixelPitchUm: manifest.camera.pixelPitchUm,
    pixelPitchUncertaintyUm: manifest.camera.pixelPitchUncertaintyUm ?? 0,
  });
  const targetId = await createEquipment(bench, 'target', {
    pattern: manifest.target.pattern,
    sizeMm: manifest.target.sizeMm,
    sizeUncertaintyMm: manifest.target.sizeUncertaintyMm ?? 0,
    ...(manifest.target.polarity ? { polarity: manifest.target.polarity } : {}),
  });
  const railScaleId = await createEquipment(bench, 'rail-scale', { uncertaintyMm: manifest.scale?.uncertaintyMm ?? 0 });
  const collimatorId = manifest.collimator ? await createEquipment(bench, 'collimator', manifest.collimator) : undefined;
  const auxiliaryLensId = manifest.auxiliaryLens ? await createEquipment(bench, 'auxiliary-lens', manifest.auxiliaryLens) : undefined;

  const workOrder = await tech.agent
    .post('/api/work-orders')
    .set(CSRF_HEADER_NAME, tech.csrfToken)
    .send({ organisationId: bench.organisationId, title: `Analysis test ${uniqueSuffix()}`, decisionRule: 'simple' });
  expect(workOrder.status, JSON.stringify(workOrder.body)).toBe(201);
  const lens = await tech.agent
    .post(`/api/work-orders/${workOrder.body.workOrder.id}/lenses`)
    .set(CSRF_HEADER_NAME, tech.csrfToken)
    .send({
      identifier: `L-${uniqueSuffix()}`,
      nominalFocalLengthMm: options.nominalFocalLengthMm ?? Math.round(fixture.truth.focalLengthMm),
      tolerancePercent: options.tolerancePercent ?? 2,
    });
  expect(lens.status, JSON.stringify(lens.body)).toBe(201);

  const created = await tech.agent
    .post('/api/measurements')
    .set(CSRF_HEADER_NAME, tech.csrfToken)
    .send({
      lensId: lens.body.lens.id,
      method: manifest.method,
      cameraId,
      targetId,
      railScaleId,
      ...(collimatorId ? { collimatorId } : {}),
      ...(auxiliaryLensId ? { auxiliaryLensId } : {}),
      sweeps: manifest.sweeps.map((sweep: Record<string, unknown>) => ({
        moving: sweep.moving,
        ...(sweep.objectPositionMm !== undefined ? { objectPositionMm: sweep.objectPositionMm } : {}),
        ...(sweep.lensPositionMm !== undefined ? { lensPositionMm: sweep.lensPositionMm } : {}),
        ...(sweep.sensorPositionMm !== undefined ? { sensorPositionMm: sweep.sensorPositionMm } : {}),
      })),
    });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  const measurement = created.body.measurement;
  const sweepIds: string[] = measurement.sweeps.map((s: { id: string }) => s.id);

  for (const [index, sweep] of (manifest.sweeps as { frames: { file: string; positionMm: number }[] }[]).entries()) {
    const queue = [...sweep.frames];
    const lanes = Array.from({ length: options.uploadConcurrency ?? 4 }, async () => {
      for (let frame = queue.shift(); frame; frame = queue.shift()) {
        const response = await tech.agent
          .post(`/api/sweeps/${sweepIds[index]}/frames`)
          .set(CSRF_HEADER_NAME, tech.csrfToken)
          .attach('frame', path.join(fixture.folder, frame.file), path.basename(frame.file));
        expect(response.status, JSON.stringify(response.body)).toBe(201);
      }
    });
    await Promise.all(lanes);
    const readings = await tech.agent
      .put(`/api/sweeps/${sweepIds[index]}/readings`)
      .set(CSRF_HEADER_NAME, tech.csrfToken)
      .send({ mode: 'table', rows: sweep.frames.map((f) => ({ fileName: path.basename(f.file), positionMm: f.positionMm })) });
    expect(readings.status, JSON.stringify(readings.body)).toBe(200);
  }
  return { measurementId: measurement.id, number: measurement.number, sweepIds };
}

export async function requestAnalysis(bench: AnalysisBench, measurementId: string): Promise<AnalysisRunSummary> {
  const response = await bench.technician.agent
    .post(`/api/measurements/${measurementId}/analyses`)
    .set(CSRF_HEADER_NAME, bench.technician.csrfToken)
    .send({});
  expect(response.status, JSON.stringify(response.body)).toBe(202);
  return response.body.analysis as AnalysisRunSummary;
}

export async function getAnalysis(session: SignedInSession, measurementId: string, version: number): Promise<AnalysisRun> {
  const response = await session.agent.get(`/api/measurements/${measurementId}/analyses/${version}`);
  expect(response.status, JSON.stringify(response.body)).toBe(200);
  return response.body.analysis as AnalysisRun;
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Polls the progress view, as the page does, until the run has finished; returns every summary seen. */
export async function waitForAnalysisToFinish(
  session: SignedInSession,
  measurementId: string,
  version: number,
  options: { timeoutMs: number; pollMs?: number },
): Promise<{ final: AnalysisRunSummary; seen: AnalysisRunSummary[] }> {
  const deadline = Date.now() + options.timeoutMs;
  const seen: AnalysisRunSummary[] = [];
  while (Date.now() < deadline) {
    const response = await session.agent.get(`/api/measurements/${measurementId}/analyses/${version}?fields=progress`);
    expect(response.status, JSON.stringify(response.body)).toBe(200);
    const summary = response.body.analysis as AnalysisRunSummary;
    seen.push(summary);
    if (summary.status === 'succeeded' || summary.status === 'failed') return { final: summary, seen };
    await sleep(options.pollMs ?? 250);
  }
  throw new Error(`Analysis version ${version} of ${measurementId} did not finish within ${options.timeoutMs} ms (last: ${JSON.stringify(seen.at(-1))}).`);
}

/** The stored row, including the worker's bookkeeping the API does not show. */
export async function analysisRunRow(testApp: TestApp, analysisRunId: string) {
  const [row] = await testApp.deps.db.select().from(analysisRuns).where(eq(analysisRuns.id, analysisRunId));
  return row;
}

export async function fileCount(folder: string): Promise<number> {
  return (await readdir(folder)).length;
}

/**
 * Starts an analysis worker as a child process (as `npm start` does), waits
 * until it is measuring frames of the given run, and kills it with SIGKILL.
 * One frame at a time, so the run is still measuring when it is caught.
 */
export async function killWorkerMidRun(testApp: TestApp, options: { analysisRunId: string; env: Record<string, string>; timeoutMs: number }): Promise<void> {
  const projectRoot = path.resolve(import.meta.dirname, '../../..');
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/workers/analysis-worker.ts'], {
    cwd: projectRoot,
    // Its outbox dispatcher would send other test files' queued mail from the shared database.
    env: { ...process.env, ...options.env, PARAXIA_ANALYSIS_ENGINE_CONCURRENCY: '1', LOG_LEVEL: 'silent', PARAXIA_WORKER_SENDS_MAIL: 'false' },
    stdio: ['ignore', 'ignore', 'inherit'],
  });
  const exited = new Promise<NodeJS.Signals | number | null>((resolve) => child.on('exit', (code, signal) => resolve(signal ?? code)));
  try {
    const deadline = Date.now() + options.timeoutMs;
    let row = await analysisRunRow(testApp, options.analysisRunId);
    while (!(row.status === 'running' && row.framesDone > 0) && Date.now() < deadline) {
      expect(row.status, 'the child worker must not finish before it is killed').not.toBe('succeeded');
      await sleep(50);
      row = await analysisRunRow(testApp, options.analysisRunId);
    }
    expect(row.status).toBe('running');
  } finally {
    child.kill('SIGKILL');
  }
  expect(await exited).toBe('SIGKILL');
}

/**
 * A new measurement of a small generated sweep, its analysis requested, and
 * the worker that took it killed in the middle of measuring: the starting
 * point of every dead-worker test.
 */
export async function analysisWithKilledWorker(testApp: TestApp, bench: AnalysisBench, env: Record<string, string>) {
  const fixture = await cachedBenchMeasurement('finite-conjugate', (s) => smallFiniteConjugate(s, { framesPerFocus: 11 }));
  const { measurementId } = await createMeasurementFromFixture(testApp, bench, fixture);
  const queued = await requestAnalysis(bench, measurementId);
  await killWorkerMidRun(testApp, { analysisRunId: queued.id, env, timeoutMs: 90_000 });
  return { fixture, measurementId, queued };
}
