import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type PgBoss from 'pg-boss';
import type pg from 'pg';
import { MeasurementError } from '../../shared/measure/engine/measurement-error';
import type { Database } from '../db/client';
import { measureFolder } from '../measure/measure-folder';
import type { AnalysisJobData } from '../services/analysis-queue';
import {
  INTERNAL_FAILURE_MESSAGE,
  claimAnalysisRun,
  recordAnalysisFailure,
  recordAnalysisProgress,
  recordAnalysisSuccess,
  returnAnalysisRunToQueue,
} from '../services/analysis-runs';
import type { Logger } from '../services/logger';
import type { ObjectStorage } from '../services/object-storage';
import { takeAnalysisRunLease } from './analysis-run-lease';
import { createProgressRecorder } from './create-progress-recorder';
import { downloadAnalysisFrames } from './download-analysis-frames';

export interface AnalysisJobContext {
  db: Database;
  /** The pool behind `db`; a run's lease holds one of its connections. */
  pool: pg.Pool;
  storage: ObjectStorage;
  log: Logger;
  /** Where each job's temporary measurement folder is made. */
  scratchDir: string;
  /** Frames the engine decodes at once. */
  engineConcurrency?: number;
  /** The page polls every second; two writes a second are plenty. */
  progressIntervalMs?: number;
}

export type AnalysisJobOutcome = 'succeeded' | 'failed' | 'nothing-to-do' | 'superseded';

/**
 * One job: claim the run, copy its frames to a temporary folder, write
 * measurement.json, run the engine, store the outcome. A user problem
 * (MeasurementError) fails the run for good and completes the job; anything
 * else is thrown so pg-boss retries it, and on the last try the run is
 * marked failed with a sentence that it is Paraxia's fault.
 */
export async function runAnalysisJob(context: AnalysisJobContext, job: PgBoss.JobWithMetadata<AnalysisJobData>): Promise<{ outcome: AnalysisJobOutcome }> {
  const { db, log } = context;
  const analysisRunId = job.data?.analysisRunId;
  if (typeof analysisRunId !== 'string') {
    log.error('An analysis job without an analysis run id was dropped.', { jobId: job.id, data: job.data });
    return { outcome: 'nothing-to-do' };
  }
  // The lease comes first: a run that is `running` always has a live lease unless its worker died.
  const lease = await takeAnalysisRunLease(context.pool, analysisRunId);
  if (!lease) throw new Error(`Analysis run ${analysisRunId} is still held by an earlier attempt; the job will be tried again.`);
  try {
    return await analyseClaimedRun(context, job, analysisRunId);
  } finally {
    await lease.release();
  }
}

async function analyseClaimedRun(
  context: AnalysisJobContext,
  job: PgBoss.JobWithMetadata<AnalysisJobData>,
  analysisRunId: string,
): Promise<{ outcome: AnalysisJobOutcome }> {
  const { db, log } = context;
  const run = await claimAnalysisRun(db, { analysisRunId, jobId: job.id });
  if (!run) {
    log.info('The analysis run of this job is already finished or gone.', { jobId: job.id, analysisRunId });
    return { outcome: 'nothing-to-do' };
  }
  const details = { jobId: job.id, analysisRunId, measurementId: run.measurementId, version: run.version, attempt: run.attempt };
  log.info('Analysis started.', details);
  const startedAt = Date.now();

  const framesTotal = run.input.manifest.sweeps.reduce((n, sweep) => n + sweep.frames.length, 0);
  const progress = createProgressRecorder({
    initial: { framesDone: 0, framesTotal },
    minIntervalMs: context.progressIntervalMs ?? 500,
    write: (p) => recordAnalysisProgress(db, { analysisRunId, attempt: run.attempt, ...p }),
    log,
  });
  try {
    // The temporary folder is gone before the outcome is written, so a finished run leaves nothing on disk.
    const folder = await mkdtemp(path.join(context.scratchDir, 'paraxia-analysis-'));
    let result;
    try {
      await downloadAnalysisFrames({ storage: context.storage, files: run.input.files, folder });
      await writeFile(path.join(folder, 'measurement.json'), `${JSON.stringify(run.input.manifest, null, 2)}\n`);
      result = await measureFolder(folder, { concurrency: context.engineConcurrency, onProgress: progress.onProgress });
    } finally {
      await progress.stop();
      await rm(folder, { recursive: true, force: true });
    }
    const stored = await recordAnalysisSuccess(db, { analysisRunId, attempt: run.attempt, result, framesTotal: progress.latest().framesTotal });
    if (!stored) {
      log.warn('Analysis finished, but a later attempt had taken the run over; this result was dropped.', details);
      return { outcome: 'superseded' };
    }
    log.info('Analysis succeeded.', { ...details, focalLengthMm: result.focalLengthMm, seconds: (Date.now() - startedAt) / 1000 });
    return { outcome: 'succeeded' };
  } catch (error) {
    if (error instanceof MeasurementError) {
      await recordAnalysisFailure(db, { analysisRunId, attempt: run.attempt, errorMessage: error.message });
      log.info('Analysis failed on the measurement itself.', { ...details, code: error.code, message: error.message });
      return { outcome: 'failed' };
    }
    const lastTry = job.retryCount >= job.retryLimit;
    log.error(lastTry ? 'Analysis failed on its last try.' : 'Analysis failed; it will be tried again.', { ...details, error });
    if (lastTry) await recordAnalysisFailure(db, { analysisRunId, attempt: run.attempt, errorMessage: INTERNAL_FAILURE_MESSAGE });
    else await returnAnalysisRunToQueue(db, { analysisRunId, attempt: run.attempt });
    throw error;
  }
}

export function defaultScratchDir(): string {
  return os.tmpdir();
}
