/**
 * The analysis queue: pg-boss 10 on Paraxia's own PostgreSQL. pg-boss keeps
 * its tables in its own schema (`pgboss`), which it creates and migrates
 * itself on start; the Drizzle migrations never touch it.
 */
import PgBoss from 'pg-boss';
import type pg from 'pg';
import { analysisQueueNameRule, numericSettings, type Env, type NumericSettingRange } from '../env';
import type { Logger } from './logger';

export const ANALYSIS_QUEUE_NAME = analysisQueueNameRule.default;

/** Jobs that used up their retries (thrown or expired) land here, so a worker can mark their run failed. */
export function deadLetterQueueName(queueName: string): string {
  return `${queueName}-exhausted`;
}

export interface AnalysisJobData {
  analysisRunId: string;
}

export interface AnalysisQueueSettings {
  /** One name per Paraxia installation sharing a database (tests give each file its own). */
  queueName: string;
  /** A job still active this long after it started is failed (and retried): a worker killed mid-analysis. */
  expireInSeconds: number;
  /** Retries after the first attempt, for failures that are not the user's (a crash, storage down). */
  retryLimit: number;
  retryDelaySeconds: number;
  /** How often expired jobs are looked for (pg-boss maintenance; one process per interval does it). */
  maintenanceIntervalSeconds: number;
  /** How often an idle worker asks for a job; pg-boss's floor is 0.5 s. */
  pollingIntervalSeconds: number;
  /**
   * How often a worker looks for runs whose worker died (no lease held) and
   * hands their jobs back at once, instead of after expireInSeconds; 0 turns it off.
   */
  orphanCheckSeconds: number;
}

export const defaultAnalysisQueueSettings: AnalysisQueueSettings = {
  queueName: ANALYSIS_QUEUE_NAME,
  expireInSeconds: numericSettings.PARAXIA_ANALYSIS_EXPIRE_SECONDS.default,
  retryLimit: numericSettings.PARAXIA_ANALYSIS_RETRY_LIMIT.default,
  retryDelaySeconds: numericSettings.PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS.default,
  maintenanceIntervalSeconds: numericSettings.PARAXIA_ANALYSIS_MAINTENANCE_SECONDS.default,
  pollingIntervalSeconds: numericSettings.PARAXIA_ANALYSIS_POLLING_SECONDS.default,
  orphanCheckSeconds: numericSettings.PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS.default,
};

type NumericSetting = Exclude<keyof AnalysisQueueSettings, 'queueName'>;

const settingRanges: Record<NumericSetting, NumericSettingRange> = {
  expireInSeconds: numericSettings.PARAXIA_ANALYSIS_EXPIRE_SECONDS,
  retryLimit: numericSettings.PARAXIA_ANALYSIS_RETRY_LIMIT,
  retryDelaySeconds: numericSettings.PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS,
  maintenanceIntervalSeconds: numericSettings.PARAXIA_ANALYSIS_MAINTENANCE_SECONDS,
  pollingIntervalSeconds: numericSettings.PARAXIA_ANALYSIS_POLLING_SECONDS,
  orphanCheckSeconds: numericSettings.PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS,
};

/**
 * Fills the queue settings' defaults and checks them, throwing a sentence
 * that names the bad option.
 */
export function checkAnalysisQueueSettings(settings: Partial<AnalysisQueueSettings> = {}): AnalysisQueueSettings {
  const checked = { ...defaultAnalysisQueueSettings };
  if (settings.queueName !== undefined) {
    if (typeof settings.queueName !== 'string' || !analysisQueueNameRule.pattern.test(settings.queueName)) {
      throw new Error(`queueName ${analysisQueueNameRule.sentence}, got ${JSON.stringify(settings.queueName)}.`);
    }
    checked.queueName = settings.queueName;
  }
  for (const key of Object.keys(settingRanges) as NumericSetting[]) {
    const value = settings[key];
    if (value === undefined) continue;
    const { min, max, integer } = settingRanges[key];
    if (typeof value !== 'number' || !Number.isFinite(value) || (integer && !Number.isInteger(value)) || value < min || value > max) {
      throw new Error(`${key} must be ${integer ? 'a whole number' : 'a number'} from ${min} to ${max}, got ${String(value)}.`);
    }
    checked[key] = value;
  }
  return checked;
}

export type AnalysisQueueEnv = Pick<
  Env,
  | 'PARAXIA_ANALYSIS_QUEUE_NAME'
  | 'PARAXIA_ANALYSIS_EXPIRE_SECONDS'
  | 'PARAXIA_ANALYSIS_RETRY_LIMIT'
  | 'PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS'
  | 'PARAXIA_ANALYSIS_MAINTENANCE_SECONDS'
  | 'PARAXIA_ANALYSIS_POLLING_SECONDS'
  | 'PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS'
>;

/** The queue settings the PARAXIA_ANALYSIS_* variables give (checked by server/env.ts). */
export function analysisQueueSettingsFromEnv(env: AnalysisQueueEnv): AnalysisQueueSettings {
  return {
    queueName: env.PARAXIA_ANALYSIS_QUEUE_NAME,
    expireInSeconds: env.PARAXIA_ANALYSIS_EXPIRE_SECONDS,
    retryLimit: env.PARAXIA_ANALYSIS_RETRY_LIMIT,
    retryDelaySeconds: env.PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS,
    maintenanceIntervalSeconds: env.PARAXIA_ANALYSIS_MAINTENANCE_SECONDS,
    pollingIntervalSeconds: env.PARAXIA_ANALYSIS_POLLING_SECONDS,
    orphanCheckSeconds: env.PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS,
  };
}

export interface AnalysisQueue {
  readonly boss: PgBoss;
  readonly settings: AnalysisQueueSettings;
  /** Queues one analysis run; resolves with the job id. */
  enqueue(analysisRunId: string): Promise<string>;
  stop(options?: { graceful?: boolean; timeoutMs?: number }): Promise<void>;
}

export interface StartAnalysisQueueOptions {
  /** Either a connection string (pg-boss opens its own small pool) or an existing pool to share. */
  databaseUrl?: string;
  pool?: pg.Pool;
  /** Connections of pg-boss's own pool (databaseUrl only). */
  maxConnections?: number;
  settings?: Partial<AnalysisQueueSettings>;
  /** Workers run maintenance (expiring jobs of killed workers); a web process only sends. */
  supervise: boolean;
  log: Logger;
}

/** pg-boss's query interface over a pool that someone else owns and closes (what pg-boss's own Db does, minus the pool). */
function sharedPoolExecutor(pool: pg.Pool): PgBoss.Db {
  return { executeSql: (text, values) => pool.query(text, values) };
}

/** Starts pg-boss and makes sure both analysis queues exist (send() to a missing queue returns null in pg-boss 10). */
export async function startAnalysisQueue(options: StartAnalysisQueueOptions): Promise<AnalysisQueue> {
  const settings = checkAnalysisQueueSettings(options.settings);
  if (!options.pool && !options.databaseUrl) throw new Error('startAnalysisQueue needs databaseUrl or pool.');
  const connection: PgBoss.DatabaseOptions = options.pool
    ? { db: sharedPoolExecutor(options.pool) }
    : { connectionString: options.databaseUrl, max: options.maxConnections ?? 3, application_name: 'paraxia-analysis-queue' };
  const boss = new PgBoss({
    ...connection,
    supervise: options.supervise,
    schedule: false,
    maintenanceIntervalSeconds: settings.maintenanceIntervalSeconds,
    // Finished jobs are kept for a week; the analysis run rows are the lasting record.
    deleteAfterDays: 7,
  });
  boss.on('error', (error) => options.log.error('The analysis queue reported an error.', { error }));
  await boss.start();
  const queueOptions = {
    retryLimit: settings.retryLimit,
    retryDelay: settings.retryDelaySeconds,
    expireInSeconds: settings.expireInSeconds,
  };
  const { queueName } = settings;
  const deadLetter = deadLetterQueueName(queueName);
  // The dead-letter queue must exist before a queue that names it.
  await boss.createQueue(deadLetter, { name: deadLetter, retryLimit: 5, retryDelay: 5 });
  await boss.createQueue(queueName, { name: queueName, ...queueOptions, deadLetter });

  return {
    boss,
    settings,
    async enqueue(analysisRunId) {
      // Per-job options, so that this process's settings apply whoever created the queue first.
      const jobId = await boss.send(queueName, { analysisRunId } satisfies AnalysisJobData, { ...queueOptions, deadLetter });
      if (!jobId) throw new Error(`The analysis queue did not accept the job for analysis run ${analysisRunId}.`);
      return jobId;
    },
    async stop(stopOptions = {}) {
      await boss.stop({ graceful: stopOptions.graceful ?? true, timeout: stopOptions.timeoutMs ?? 30_000, close: true, wait: true });
    },
  };
}

const producers = new WeakMap<pg.Pool, Promise<AnalysisQueue>>();

/**
 * The web process's sender, one per database pool and sharing it (so it adds
 * no connections and closes with the pool). Settings come from the
 * PARAXIA_ANALYSIS_* variables in `deps.env`.
 */
export function analysisQueueFor(deps: { pool: pg.Pool; log: Logger; env: AnalysisQueueEnv }): Promise<AnalysisQueue> {
  let producer = producers.get(deps.pool);
  if (!producer) {
    producer = startAnalysisQueue({ pool: deps.pool, supervise: false, settings: analysisQueueSettingsFromEnv(deps.env), log: deps.log });
    producers.set(deps.pool, producer);
    // A failed start is not cached: the next request tries again.
    producer.catch(() => producers.delete(deps.pool));
  }
  return producer;
}
