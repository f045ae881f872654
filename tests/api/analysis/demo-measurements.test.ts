import { eq, inArray } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analysisRuns, frames, measurements, people, sweeps } from '../../../server/db/schema';
import { createLogger } from '../../../server/services/logger';
import { createPasswordHasher } from '../../../server/services/passwords';
import { startAnalysisWorker, type RunningAnalysisWorker } from '../../../server/workers/analysis-worker';
import { demoMeasurementPlans, seedDemoMeasurements } from '../../../scripts/seed/demo-measurements';
import { seedDemo, type SeedDemoResult } from '../../../scripts/seed/seed-demo';
import { uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { sleep } from './analysis-bench';

// This file's own queue, so workers of other test files never take its jobs.
process.env.PARAXIA_ANALYSIS_QUEUE_NAME = `analyse-test-demo-${uniqueSuffix()}`;
process.env.PARAXIA_ANALYSIS_POLLING_SECONDS = '0.5';

const DEMO_TECHNICIAN_EMAIL = 'tech@larkspur-lab.example';
/** Two of the plans keep the test short: a converging lens and the diverging one (auxiliary lens). */
const plans = demoMeasurementPlans.filter((plan) => plan.key === 'demo-pcx-100-01-finite-conjugate' || plan.key === 'demo-bcv-50-01-auxiliary-lens');

let testApp: TestApp;
let catalogue: SeedDemoResult;
let worker: RunningAnalysisWorker | undefined;

beforeAll(async () => {
  testApp = createTestApp();
  catalogue = await seedDemo({ db: testApp.deps.db, passwords: createPasswordHasher({ rounds: 4 }) });
});

afterAll(async () => {
  await worker?.stop();
  await testApp?.close();
});

describe('seedDemoMeasurements', () => {
  it('has a plan for every method, a square target, and six QI-PCX-100 lenses inside and outside ±1 %', () => {
    expect(new Set(demoMeasurementPlans.map((p) => p.method))).toEqual(
      new Set(['finite-conjugate', 'multi-conjugate', 'displacement', 'collimator', 'auxiliary-lens']),
    );
    expect(demoMeasurementPlans.some((p) => p.scenario.target.pattern === 'square')).toBe(true);
    const auxiliary = demoMeasurementPlans.find((p) => p.method === 'auxiliary-lens')!;
    expect(auxiliary.scenario.lens.focalLengthMm).toBeLessThan(0);
    const batch = demoMeasurementPlans.filter((p) => p.lensKey.startsWith('pcx-100-'));
    expect(batch.map((p) => p.method)).toEqual(Array(6).fill('finite-conjugate'));
    const deviations = batch.map((p) => Math.abs(p.scenario.lens.focalLengthMm - 100) / 100);
    expect(deviations.filter((d) => d < 0.01).length).toBeGreaterThanOrEqual(3);
    expect(deviations.filter((d) => d > 0.01 && d < 0.02).length).toBeGreaterThanOrEqual(1);
  });

  it('stores the frames, sets the readings and queues an analysis per measurement once; a second seeding adds nothing', async () => {
    const technicianId = catalogue.personIdsByEmail[DEMO_TECHNICIAN_EMAIL];
    const deps = { db: testApp.deps.db, pool: testApp.deps.pool, storage: testApp.deps.storage, log: createLogger({ level: 'silent' }) };
    const options = {
      lensIdsByKey: catalogue.lensIdsByKey,
      equipmentIdsByIdentifier: catalogue.equipmentIdsByIdentifier,
      technicianId,
      today: new Date().toISOString().slice(0, 10),
      report: () => undefined,
      plans,
    };
    const first = await seedDemoMeasurements(deps, options);
    // No other test file seeds demo measurements (the catalogue tests seed without object storage).
    expect(first).toEqual({ created: 2, framesStored: 30, analysesQueued: 2 });
    const second = await seedDemoMeasurements(deps, options);
    expect(second).toEqual({ created: 0, framesStored: 0, analysesQueued: 0 });

    const lensIds = plans.map((plan) => catalogue.lensIdsByKey[plan.lensKey]);
    const rows = await testApp.deps.db
      .select({ id: measurements.id, lensId: measurements.lensId, method: measurements.method, performedBy: people.email })
      .from(measurements)
      .innerJoin(people, eq(people.id, measurements.performedById))
      .where(inArray(measurements.lensId, lensIds));
    expect(rows.map((row) => row.method).sort()).toEqual(plans.map((plan) => plan.method).sort());
    expect(rows.every((row) => row.performedBy === DEMO_TECHNICIAN_EMAIL)).toBe(true);
    for (const row of rows) {
      const frameRows = await testApp.deps.db
        .select({ positionMm: frames.positionMm })
        .from(frames)
        .innerJoin(sweeps, eq(sweeps.id, frames.sweepId))
        .where(eq(sweeps.measurementId, row.id));
      expect(frameRows).toHaveLength(15);
      expect(frameRows.every((frame) => frame.positionMm !== null)).toBe(true);
      expect(await testApp.deps.db.$count(analysisRuns, eq(analysisRuns.measurementId, row.id))).toBe(1);
    }

    // The worker runs the queued analyses: the real pipeline, as after `npm start`.
    worker = await startAnalysisWorker({ env: testApp.deps.env, log: createLogger({ level: 'silent' }) });
    const deadline = Date.now() + 150_000;
    let runs = await testApp.deps.db.select().from(analysisRuns).where(inArray(analysisRuns.measurementId, rows.map((r) => r.id)));
    while (runs.some((run) => run.status === 'queued' || run.status === 'running') && Date.now() < deadline) {
      await sleep(500);
      runs = await testApp.deps.db.select().from(analysisRuns).where(inArray(analysisRuns.measurementId, rows.map((r) => r.id)));
    }
    for (const row of rows) {
      const run = runs.find((r) => r.measurementId === row.id)!;
      expect(run.status, run.errorMessage ?? '').toBe('succeeded');
      const plan = plans.find((p) => catalogue.lensIdsByKey[p.lensKey] === row.lensId)!;
      const truthMm = plan.scenario.lens.focalLengthMm;
      const measuredMm = (run.result as { focalLengthMm: number }).focalLengthMm;
      expect(Math.abs(measuredMm - truthMm) / Math.abs(truthMm)).toBeLessThan(0.005);
    }
  }, 300_000);
});
