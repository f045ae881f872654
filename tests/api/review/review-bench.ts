/**
 * Measurements in any review state, quickly: one real engine result (the
 * project's synthetic bench, small finite-conjugate sweep, measured once per
 * test file with measureFolder) is attached as the succeeded current
 * analysis of measurement rows inserted straight into the shared test
 * database. The manifest it was measured with carries the bench lens's
 * specification and the work order's decision rule, as engine-manifest.ts
 * gives the worker, so the result's conformity is the lens's. The
 * transitions under test then run through the real API.
 */
import { eq } from 'drizzle-orm';
import { analyseMeasurement } from '../../../shared/measure/engine/analyse-measurement';
import type { MeasurementManifest } from '../../../shared/schemas/measurement-manifest';
import type { MeasurementResult } from '../../../shared/schemas/measurement-result';
import { analysisRuns, frames, measurements, sweeps, type MeasurementStatus } from '../../../server/db/schema';
import { loadMeasurementFolder } from '../../../server/measure/load-measurement-folder';
import { SharpFrameSource } from '../../../server/measure/sharp-frame-source';
import { todayIsoDate } from '../../../server/services/equipment';
import { cachedBenchMeasurement, type CachedBenchMeasurement } from '../../../scripts/synth/cached-bench-measurement';
import { smallFiniteConjugate } from '../analysis/small-bench';
import { createTestBench, createTestLens, createTestWorkOrder, type TestBench } from '../measurements/bench-records';
import { uniqueSuffix, createTestOrganisation } from '../../helpers/people';
import type { TestApp } from '../../helpers/test-app';

export interface ReviewBench {
  fixture: CachedBenchMeasurement;
  /** The generated manifest with the bench lens's specification added, as analysed. */
  analysedManifest: MeasurementManifest;
  result: MeasurementResult;
  equipment: TestBench;
  workOrder: Awaited<ReturnType<typeof createTestWorkOrder>>['workOrder'];
  organisation: Awaited<ReturnType<typeof createTestWorkOrder>>['organisation'];
  lens: Awaited<ReturnType<typeof createTestLens>>;
}

export async function createReviewBench(testApp: TestApp): Promise<ReviewBench> {
  const fixture = await cachedBenchMeasurement('finite-conjugate', (s) => smallFiniteConjugate(s));
  // The issuing lab: certificates print its address (a test lab gets an invented one).
  await createTestOrganisation(testApp.deps, { kind: 'lab' });
  const { workOrder, organisation } = await createTestWorkOrder(testApp.deps);
  const lens = await createTestLens(testApp.deps, workOrder.id, { nominalFocalLengthMm: Math.round(fixture.truth.focalLengthMm), tolerancePercent: 2 });
  const equipment = await createTestBench(testApp.deps);
  const analysedManifest: MeasurementManifest = {
    ...(await loadMeasurementFolder(fixture.folder)),
    lens: { nominalFocalLengthMm: lens.nominalFocalLengthMm, tolerancePercent: lens.tolerancePercent ?? undefined, decisionRule: workOrder.decisionRule },
  };
  const result = await analyseMeasurement({ manifest: analysedManifest, source: new SharpFrameSource(fixture.folder), concurrency: 2, monteCarloDraws: 20_000 });
  return { fixture, analysedManifest, result, equipment, workOrder, organisation, lens };
}

export interface StagedMeasurement {
  id: string;
  number: string;
  analysisRunId: string;
  sweepId: string;
  frameId: string;
}

/**
 * A measurement performed by `performedById` with a succeeded analysis, put
 * straight into `status` with the review fields that state implies.
 */
export async function stageMeasurement(
  testApp: TestApp,
  bench: ReviewBench,
  options: { performedById: string; status: MeasurementStatus; submittedById?: string; approvedById?: string },
): Promise<StagedMeasurement> {
  const { db } = testApp.deps;
  const number = `M-T-${uniqueSuffix()}`;
  const reviewed = ['submitted', 'approved', 'certified'].includes(options.status);
  const approved = ['approved', 'certified'].includes(options.status);
  const [row] = await db
    .insert(measurements)
    .values({
      number,
      lensId: bench.lens.id,
      method: 'finite-conjugate',
      status: options.status,
      cameraId: bench.equipment.camera.id,
      targetId: bench.equipment.target.id,
      railScaleId: bench.equipment.railScale.id,
      temperatureC: 20.7,
      relativeHumidityPercent: 43,
      measuredOn: todayIsoDate(),
      performedById: options.performedById,
      submittedById: reviewed ? (options.submittedById ?? options.performedById) : null,
      submittedAt: reviewed ? new Date() : null,
      approvedById: approved ? (options.approvedById ?? null) : null,
      approvedAt: approved ? new Date() : null,
    })
    .returning({ id: measurements.id });
  const [sweep] = await db
    .insert(sweeps)
    .values({ measurementId: row.id, position: 0, moving: 'sensor', objectPositionMm: 0, lensPositionMm: 300 })
    .returning({ id: sweeps.id });
  const [frame] = await db
    .insert(frames)
    .values({
      sweepId: sweep.id,
      fileName: '0001.jpg',
      positionMm: 450,
      objectKey: `test/${row.id}/0001.jpg`,
      contentType: 'image/jpeg',
      byteSize: 1000,
      widthPx: 800,
      heightPx: 600,
      bitDepth: 8,
      sha256: '0'.repeat(64),
    })
    .returning({ id: frames.id });
  const hasResult = !['draft', 'analysis-failed'].includes(options.status);
  const [run] = await db
    .insert(analysisRuns)
    .values({
      measurementId: row.id,
      version: 1,
      status: options.status === 'analysing' ? 'running' : hasResult ? 'succeeded' : 'failed',
      manifest: { manifest: bench.analysedManifest, files: [] },
      result: hasResult && options.status !== 'analysing' ? (bench.result as unknown as Record<string, unknown>) : null,
      finishedAt: new Date(),
    })
    .returning({ id: analysisRuns.id });
  if (hasResult && options.status !== 'analysing') await db.update(measurements).set({ currentAnalysisId: run.id }).where(eq(measurements.id, row.id));
  return { id: row.id, number, analysisRunId: run.id, sweepId: sweep.id, frameId: frame.id };
}

export async function measurementStatusOf(testApp: TestApp, measurementId: string): Promise<MeasurementStatus> {
  const [row] = await testApp.deps.db.select({ status: measurements.status }).from(measurements).where(eq(measurements.id, measurementId));
  return row.status;
}
