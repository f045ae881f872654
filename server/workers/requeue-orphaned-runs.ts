import { and, eq, isNotNull, lt, sql } from 'drizzle-orm';
import type PgBoss from 'pg-boss';
import type pg from 'pg';
import type { Database } from '../db/client';
import { analysisRuns } from '../db/schema';
import { returnAnalysisRunToQueue } from '../services/analysis-runs';
import type { Logger } from '../services/logger';
import { isAnalysisRunLeaseFree } from './analysis-run-lease';

/**
 * Finds runs that are `running` while no worker holds their lease (their
 * worker was killed) and fails their active job, so pg-boss retries it after
 * the retry delay instead of after the job's expiry. Only jobs of this
 * queue are touched. Returns how many runs went back to the queue.
 */
export async function requeueOrphanedRuns(options: {
  db: Database;
  pool: pg.Pool;
  boss: PgBoss;
  queueName: string;
  log: Logger;
  /** Runs started more recently than this are left alone. */
  minimumAgeSeconds: number;
}): Promise<number> {
  const { db } = options;
  const candidates = await db
    .select({ id: analysisRuns.id, jobId: analysisRuns.jobId, attempt: analysisRuns.attempts })
    .from(analysisRuns)
    .where(
      and(
        eq(analysisRuns.status, 'running'),
        isNotNull(analysisRuns.jobId),
        lt(analysisRuns.startedAt, sql`now() - make_interval(secs => ${options.minimumAgeSeconds})`),
      ),
    );
  let requeued = 0;
  for (const run of candidates) {
    if (!(await isAnalysisRunLeaseFree(options.pool, run.id))) continue;
    const job = await options.boss.getJobById(options.queueName, run.jobId!);
    if (!job || job.state !== 'active') continue;
    // The run may have finished between the first read and the lease check.
    const [still] = await db
      .select({ id: analysisRuns.id })
      .from(analysisRuns)
      .where(and(eq(analysisRuns.id, run.id), eq(analysisRuns.status, 'running'), eq(analysisRuns.attempts, run.attempt)));
    if (!still) continue;
    await options.boss.fail(options.queueName, run.jobId!, { message: 'The analysis worker running this job stopped without finishing it.' });
    await returnAnalysisRunToQueue(db, { analysisRunId: run.id, attempt: run.attempt });
    options.log.warn('An analysis run whose worker stopped went back to the queue.', { analysisRunId: run.id, jobId: run.jobId, attempt: run.attempt });
    requeued += 1;
  }
  return requeued;
}
