import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startAnalysisWorker, type RunningAnalysisWorker } from '../../../server/workers/analysis-worker';
import { uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import {
  analysisRunRow,
  createAnalysisBench,
  analysisWithKilledWorker,
  waitForAnalysisToFinish,
  type AnalysisBench,
} from './analysis-bench';

/*
 * The job would expire only after 15 minutes (the default), far beyond this
 * test's time limit: the run can only come back through the lease check,
 * which sees that no live worker holds the run.
 */
const queueEnv = {
  PARAXIA_ANALYSIS_QUEUE_NAME: `analyse-test-lease-${uniqueSuffix()}`,
  PARAXIA_ANALYSIS_EXPIRE_SECONDS: '900',
  PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: '1',
  PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5',
  PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: '1',
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

describe('a killed analysis worker’s lease', () => {
  it('is gone with its connection, so another worker requeues and finishes the run long before the job would expire', async () => {
    const { measurementId, queued } = await analysisWithKilledWorker(testApp, bench, queueEnv);
    expect(await analysisRunRow(testApp, queued.id)).toMatchObject({ status: 'running', result: null, attempts: 1 });

    rescuer = await startAnalysisWorker({ env: testApp.deps.env });
    const { final, seen } = await waitForAnalysisToFinish(bench.technician, measurementId, queued.version, { timeoutMs: 150_000, pollMs: 200 });
    expect(final.status, final.errorMessage ?? '').toBe('succeeded');
    // Handed back, the run showed as waiting again before the second attempt began.
    expect(seen.some((summary) => summary.status === 'queued')).toBe(true);
    expect((await analysisRunRow(testApp, queued.id)).attempts).toBe(2);
  }, 300_000);
});
