import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Logger } from '../../../server/services/logger';
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

// This file's own queue, so workers of other test files never take its jobs.
process.env.PARAXIA_ANALYSIS_QUEUE_NAME = `analyse-test-shared-${uniqueSuffix()}`;
process.env.PARAXIA_ANALYSIS_POLLING_SECONDS = '0.5';

/** A logger that keeps which analysis runs this worker started. */
function recordingLogger(started: string[]): Logger {
  const ignore = () => undefined;
  return {
    debug: ignore,
    warn: ignore,
    error: ignore,
    info: (message, details) => {
      if (message === 'Analysis started.') started.push(String(details?.analysisRunId));
    },
  };
}

let testApp: TestApp;
let bench: AnalysisBench;
const startedByWorker: string[][] = [[], []];
const workers: RunningAnalysisWorker[] = [];

beforeAll(async () => {
  testApp = createTestApp();
  bench = await createAnalysisBench(testApp);
  for (const started of startedByWorker) workers.push(await startAnalysisWorker({ env: testApp.deps.env, log: recordingLogger(started) }));
});

afterAll(async () => {
  await Promise.all(workers.map((worker) => worker.stop()));
  await testApp?.close();
});

describe('two analysis workers on one queue', () => {
  it('finish three queued runs with each run started exactly once between them', async () => {
    const fixture = await benchFixture('finite-conjugate', (s) => smallFiniteConjugate(s, { framesPerFocus: 11 }));
    const created = [];
    for (let k = 0; k < 3; k++) created.push(await createMeasurementFromFixture(testApp, bench, fixture));
    const runs = [];
    for (const { measurementId } of created) runs.push({ measurementId, run: await requestAnalysis(bench, measurementId) });

    for (const { measurementId, run } of runs) {
      const { final } = await waitForAnalysisToFinish(bench.technician, measurementId, run.version, { timeoutMs: 150_000, pollMs: 500 });
      expect(final.status, final.errorMessage ?? '').toBe('succeeded');
    }
    for (const { run } of runs) expect((await analysisRunRow(testApp, run.id)).attempts).toBe(1);
    const allStarts = startedByWorker.flat();
    expect(allStarts.sort()).toEqual(runs.map(({ run }) => run.id).sort());
  }, 240_000);
});
