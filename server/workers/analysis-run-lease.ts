import type pg from 'pg';

/**
 * A run's lease is a PostgreSQL session advisory lock held on its own
 * connection while a worker works on the run. The server drops it the moment
 * that connection goes, so a worker that was killed (or lost its machine)
 * leaves a run that is `running` with no lease: any other worker can see that
 * and hand the job back to the queue at once instead of waiting for it to expire.
 */
const LEASE_LOCK_CLASS = 0x50_41_52_41; // "PARA": keeps these locks apart from any other advisory lock user.

export interface AnalysisRunLease {
  release(): Promise<void>;
}

/** Takes the run's lease; null when another attempt still holds it. */
export async function takeAnalysisRunLease(pool: pg.Pool, analysisRunId: string): Promise<AnalysisRunLease | null> {
  const client = await pool.connect();
  try {
    const { rows } = await client.query<{ taken: boolean }>('select pg_try_advisory_lock($1::int, hashtext($2)) as taken', [LEASE_LOCK_CLASS, analysisRunId]);
    if (!rows[0]?.taken) {
      client.release();
      return null;
    }
  } catch (error) {
    client.release(error as Error);
    throw error;
  }
  let released = false;
  return {
    async release() {
      if (released) return;
      released = true;
      try {
        await client.query('select pg_advisory_unlock($1::int, hashtext($2))', [LEASE_LOCK_CLASS, analysisRunId]);
        client.release();
      } catch (error) {
        // Destroying the connection ends the session, which drops the lock as well.
        client.release(error as Error);
      }
    },
  };
}

/** True when no live session holds the run's lease. */
export async function isAnalysisRunLeaseFree(pool: pg.Pool, analysisRunId: string): Promise<boolean> {
  const lease = await takeAnalysisRunLease(pool, analysisRunId);
  if (!lease) return false;
  await lease.release();
  return true;
}
