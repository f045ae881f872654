/**
 * The analysis worker: takes analysis jobs from the queue one at a time and
 * runs the measurement engine on them. Start as many processes as there are
 * machines or cores to spare (PARAXIA_ANALYSIS_WORKERS under npm start); they
 * share the queue and never take the same job (pg-boss fetches with SKIP LOCKED).
 */
import { mkdir } from 'node:fs/promises';
import { pathToFileURL } from 'node:url';
import { createDatabase } from '../db/client';
import { loadEnvOrExit, type Env } from '../env';
import {
  analysisQueueSettingsFromEnv,
  deadLetterQueueName,
  startAnalysisQueue,
  type AnalysisJobData,
  type AnalysisQueueSettings,
} from '../services/analysis-queue';
import { INTERNAL_FAILURE_MESSAGE, recordAnalysisFailure } from '../services/analysis-runs';
import { createLogger, type Logger } from '../services/logger';
import { createObjectStorage } from '../services/object-storage';
import { requeueOrphanedRuns } from './requeue-orphaned-runs';
import { startWorkerMailDispatcher } from '../services/outbound-mail/start-worker-mail-dispatcher';
import { defaultScratchDir, runAnalysisJob } from './run-analysis-job';

export interface AnalysisWorkerOptions {
  env: Env;
  /** Each defaults to its PARAXIA_ANALYSIS_* variable in `env`. */
  queueSettings?: Partial<AnalysisQueueSettings>;
  log?: Logger;
  /** Frames the engine decodes at once; default PARAXIA_ANALYSIS_ENGINE_CONCURRENCY, else the engine's. */
  engineConcurrency?: number;
  /** Default PARAXIA_ANALYSIS_SCRATCH_DIR, else a folder in the system's temporary folder. */
  scratchDir?: string;
  /** How long stop() waits for a job under way before giving it back to the queue. */
  stopGraceMs?: number;
}

export interface RunningAnalysisWorker {
  stop(): Promise<void>;
}

/** Starts one worker in this process (the entry point below, or a test). */
export async function startAnalysisWorker(options: AnalysisWorkerOptions): Promise<RunningAnalysisWorker> {
  const { env } = options;
  const log = options.log ?? createLogger({ level: env.LOG_LEVEL, name: 'analysis-worker' });
  const settings = { ...analysisQueueSettingsFromEnv(env), ...options.queueSettings };
  // One connection holds the lease of the run under way; the others serve progress writes and checks.
  const { pool, db } = createDatabase({ databaseUrl: env.DATABASE_URL, maxConnections: 4 });
  const storage = createObjectStorage(env);
  const context = {
    db,
    pool,
    storage,
    log,
    scratchDir: options.scratchDir ?? env.PARAXIA_ANALYSIS_SCRATCH_DIR ?? defaultScratchDir(),
    engineConcurrency: options.engineConcurrency ?? env.PARAXIA_ANALYSIS_ENGINE_CONCURRENCY,
  };
  // Each job makes its own folder inside this one; a missing parent would fail every job.
  await mkdir(context.scratchDir, { recursive: true });

  let queue;
  let orphanTimer: NodeJS.Timeout | undefined;
  try {
    queue = await startAnalysisQueue({ databaseUrl: env.DATABASE_URL, maxConnections: 3, supervise: true, settings, log });
    const polling = { pollingIntervalSeconds: queue.settings.pollingIntervalSeconds };
    // batchSize 1: one analysis at a time per process; the engine itself uses the cores.
    await queue.boss.work<AnalysisJobData>(queue.settings.queueName, { ...polling, batchSize: 1, includeMetadata: true }, async ([job]) =>
      runAnalysisJob(context, job),
    );
    // Jobs whose retries are used up (thrown every time, or expired with their worker dead).
    await queue.boss.work<AnalysisJobData>(deadLetterQueueName(queue.settings.queueName), { ...polling, batchSize: 1 }, async ([job]) => {
      const analysisRunId = job.data?.analysisRunId;
      if (typeof analysisRunId !== 'string') return { changed: false };
      const changed = await recordAnalysisFailure(db, { analysisRunId, errorMessage: INTERNAL_FAILURE_MESSAGE });
      if (changed) log.warn('An analysis run used up its retries and is marked failed.', { analysisRunId });
      return { changed };
    });
    const { orphanCheckSeconds, queueName } = queue.settings;
    if (orphanCheckSeconds > 0) {
      const boss = queue.boss;
      let checking = false;
      const check = () => {
        if (checking) return;
        checking = true;
        requeueOrphanedRuns({ db, pool, boss, queueName, log, minimumAgeSeconds: 5 })
          .catch((error: unknown) => log.warn('Looking for analysis runs whose worker stopped failed.', { error }))
          .finally(() => (checking = false));
      };
      check();
      orphanTimer = setInterval(check, orphanCheckSeconds * 1000);
    }
  } catch (error) {
    await queue?.stop({ graceful: false }).catch(() => undefined);
    storage.close();
    await pool.end();
    throw error;
  }
  log.info('Analysis worker ready.', { ...queue.settings });

  let stopping: Promise<void> | null = null;
  return {
    stop() {
      stopping ??= (async () => {
        clearInterval(orphanTimer);
        await queue.stop({ graceful: true, timeoutMs: options.stopGraceMs ?? 8_000 });
        storage.close();
        await pool.end();
        log.info('Analysis worker stopped.');
      })();
      return stopping;
    },
  };
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  const env = loadEnvOrExit();
  const log = createLogger({ level: env.LOG_LEVEL, name: 'analysis-worker' });
  startAnalysisWorker({ env, log }).then(
    (worker) => {
      // The outbox is sent from here, never from the web process, so no request waits on SMTP.
      const mail = env.PARAXIA_WORKER_SENDS_MAIL ? startWorkerMailDispatcher(env, log) : { stop: async () => undefined };
      const shutDown = (signal: string) => {
        log.info('Stopping the analysis worker.', { signal });
        Promise.all([worker.stop(), mail.stop()]).then(
          () => process.exit(0),
          (error: Error) => {
            log.error('The analysis worker did not stop cleanly.', { error });
            process.exit(1);
          },
        );
      };
      process.once('SIGTERM', () => shutDown('SIGTERM'));
      process.once('SIGINT', () => shutDown('SIGINT'));
    },
    (error: Error) => {
      log.error('The analysis worker could not start.', { error });
      process.exit(1);
    },
  );
}
