import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { measurements } from '../../../server/db/schema';
import { createLogger } from '../../../server/services/logger';
import { INTERNAL_FAILURE_MESSAGE } from '../../../server/services/analysis-runs';
import { startAnalysisWorker, type RunningAnalysisWorker } from '../../../server/workers/analysis-worker';
import { cachedBenchMeasurement as benchFixture } from '../../../scripts/synth/cached-bench-measurement';
import { uniqueSuffix } from '../../helpers/people';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import {
  analysisRunRow,
  createAnalysisBench,
  createMeasurementFromFixture,
  requestAnalysis,
  waitForAnalysisToFinish,
  type AnalysisBench,
} from './analysis-bench';
import { smallFiniteConjugate } from './small-bench';

// This file's own queue; one retry a second after the first failure keeps the test short.
Object.assign(process.env, {
  PARAXIA_ANALYSIS_QUEUE_NAME: `analyse-test-internal-${uniqueSuffix()}`,
  PARAXIA_ANALYSIS_RETRY_LIMIT: '1',
  PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: '1',
  PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5',
});

let testApp: TestApp;
let bench: AnalysisBench;
let worker: RunningAnalysisWorker | undefined;

beforeAll(async () => {
  testApp = createTestApp();
  bench = await createAnalysisBench(testApp);
});

afterAll(async () => {
  await worker?.stop();
  await testApp?.close();
});

describe('an analysis that fails for a reason that is not the user’s', () => {
  it('is tried again, and after its last try the run fails with a sentence saying so and the measurement is analysis-failed', async () => {
    const fixture = await benchFixture('finite-conjugate', (s) => smallFiniteConjugate(s, { framesPerFocus: 11 }));
    const { measurementId } = await createMeasurementFromFixture(testApp, bench, fixture);
    const queued = await requestAnalysis(bench, measurementId);

    // A worker whose object storage cannot be reached (nothing listens on the discard port).
    worker = await startAnalysisWorker({ env: { ...testApp.deps.env, S3_ENDPOINT: 'http://127.0.0.1:9' }, log: createLogger({ level: 'silent' }) });
    const { final } = await waitForAnalysisToFinish(bench.technician, measurementId, queued.version, { timeoutMs: 120_000 });
    expect(final.status).toBe('failed');
    expect(final.errorMessage).toBe(INTERNAL_FAILURE_MESSAGE);
    const row = await analysisRunRow(testApp, queued.id);
    expect(row.attempts).toBe(2);
    expect(row.result).toBeNull();
    const [measurement] = await testApp.deps.db.select({ status: measurements.status }).from(measurements).where(eq(measurements.id, measurementId));
    expect(measurement.status).toBe('analysis-failed');
  }, 180_000);
});
