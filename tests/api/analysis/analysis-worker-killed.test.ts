import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startAnalysisWorker, type RunningAnalysisWorker } from '../../../server/workers/analysis-worker';
import { uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import {
  analysisRunRow,
  createAnalysisBench,
  analysisWithKilledWorker,
  getAnalysis,
  waitForAnalysisToFinish,
  type AnalysisBench,
} from './analysis-bench';

/*
 * A short expiry makes a dead worker's job come back in seconds instead of
 * a quarter of an hour; it must still be longer than one whole analysis on a
 * busy test machine, or the healthy worker's run would expire too.
 * Maintenance (which expires jobs) runs every second here, and the lease
 * check that would otherwise notice the dead worker sooner is off.
 */
const queueEnv = {
  PARAXIA_ANALYSIS_QUEUE_NAME: `analyse-test-expired-${uniqueSuffix()}`,
  PARAXIA_ANALYSIS_EXPIRE_SECONDS: '40',
  PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: '1',
  PARAXIA_ANALYSIS_MAINTENANCE_SECONDS: '1',
  PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5',
  PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: '0',
};
Object.assign(process.env, queueEnv);

let testApp: TestApp;
let bench: AnalysisBench;
let rescuer: RunningAnalysisWorker | undefined;

beforeAll(async () => {
  testApp = createTestApp();
  bench = await createAnalysisBench(testApp);
});

afterAll(async () => {
  await rescuer?.stop();
  await testApp?.close();
});

describe('an analysis worker killed in the middle of a run', () => {
  it('leaves the run running with no result, and once the job expires another worker finishes it from the start', async () => {
    const { fixture, measurementId, queued } = await analysisWithKilledWorker(testApp, bench, queueEnv);
    const afterKill = await analysisRunRow(testApp, queued.id);
    expect(afterKill).toMatchObject({ status: 'running', result: null, attempts: 1, finishedAt: null });
    expect(afterKill.framesDone).toBeGreaterThan(0);
    expect(afterKill.framesDone).toBeLessThan(afterKill.framesTotal);

    rescuer = await startAnalysisWorker({ env: testApp.deps.env });
    const { final } = await waitForAnalysisToFinish(bench.technician, measurementId, queued.version, { timeoutMs: 150_000, pollMs: 250 });
    expect(final.status, final.errorMessage ?? '').toBe('succeeded');
    expect(final.framesDone).toBe(final.framesTotal);
    expect((await analysisRunRow(testApp, queued.id)).attempts).toBe(2);
    const run = await getAnalysis(bench.technician, measurementId, queued.version);
    const truthMm = fixture.truth.focalLengthMm;
    expect(Math.abs(run.result!.focalLengthMm - truthMm) / truthMm).toBeLessThan(0.005);
  }, 300_000);
});
