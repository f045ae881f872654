/**
 * The analysis queue: pg-boss 10 on Paraxia's own PostgreSQL. pg-boss keeps
 * its tables in its own schema (`pgboss`), which it creates and migrates
 * itself on start; the Drizzle migrations never touch it.
 */
import PgBoss from 'pg-boss';
import type pg from 'pg';
import type { Logger } from './logger';

export const ANALYSIS_QUEUE_NAME = 'analyse-measurement';

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
  expireInSeconds: 15 * 60,
  retryLimit: 2,
  retryDelaySeconds: 15,
  maintenanceIntervalSeconds: 60,
  pollingIntervalSeconds: 2,
  orphanCheckSeconds: 20,
};

type NumericSetting = Exclude<keyof AnalysisQueueSettings, 'queueName'>;

const QUEUE_NAME_PATTERN = /^[a-z0-9][a-z0-9-]{0,60}$/;
const QUEUE_NAME_RULE = 'must be 1 to 61 lower-case letters, digits or hyphens, starting with a letter or digit';

const settingVariables: Record<NumericSetting, { variable: string; min: number; max: number; integer: boolean }> = {
  expireInSeconds: { variable: 'PARAXIA_ANALYSIS_EXPIRE_SECONDS', min: 1, max: 23 * 3600, integer: true },
  retryLimit: { variable: 'PARAXIA_ANALYSIS_RETRY_LIMIT', min: 0, max: 20, integer: true },
  retryDelaySeconds: { variable: 'PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS', min: 0, max: 3600, integer: true },
  maintenanceIntervalSeconds: { variable: 'PARAXIA_ANALYSIS_MAINTENANCE_SECONDS', min: 1, max: 3600, integer: true },
  pollingIntervalSeconds: { variable: 'PARAXIA_ANALYSIS_POLLING_SECONDS', min: 0.5, max: 600, integer: false },
  orphanCheckSeconds: { variable: 'PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS', min: 0, max: 3600, integer: true },
};

/**
 * Fills the queue settings' defaults and checks them, throwing a sentence
 * that names the bad option.
 */
export function checkAnalysisQueueSettings(settings: Partial<AnalysisQueueSettings> = {}): AnalysisQueueSettings {
  const checked = { ...defaultAnalysisQueueSettings };
  if (settings.queueName !== undefined) {
    if (typeof settings.queueName !== 'string' || !QUEUE_NAME_PATTERN.test(settings.queueName)) {
      throw new Error(`queueName ${QUEUE_NAME_RULE}, got ${JSON.stringify(settings.queueName)}.`);
    }
    checked.queueName = settings.queueName;
  }
  for (const key of Object.keys(settingVariables) as NumericSetting[]) {
    const value = settings[key];
    if (value === undefined) continue;
    const { min, max, integer } = settingVariables[key];
    if (typeof value !== 'number' || !Number.isFinite(value) || (integer && !Number.isInteger(value)) || value < min || value > max) {
      throw new Error(`${key} must be ${integer ? 'a whole number' : 'a number'} from ${min} to ${max}, got ${String(value)}.`);
    }
    checked[key] = value;
  }
  return checked;
}

/** Reads the queue settings from PARAXIA_ANALYSIS_* variables; unset or empty means the default. */
export function readAnalysisQueueSettings(source: Record<string, string | undefined> = process.env): AnalysisQueueSettings {
  const given: Partial<AnalysisQueueSettings> = {};
  const queueName = source.PARAXIA_ANALYSIS_QUEUE_NAME;
  if (queueName !== undefined && queueName.trim() !== '') {
    if (!QUEUE_NAME_PATTERN.test(queueName)) throw new Error(`PARAXIA_ANALYSIS_QUEUE_NAME ${QUEUE_NAME_RULE} (got ${JSON.stringify(queueName)}).`);
    given.queueName = queueName;
  }
  for (const [key, { variable, min, max, integer }] of Object.entries(settingVariables) as [
    NumericSetting,
    (typeof settingVariables)[NumericSetting],
  ][]) {
    const raw = source[variable];
    if (raw === undefined || raw.trim() === '') continue;
    const value = Number(raw);
    if (!Number.isFinite(value) || (integer && !Number.isInteger(value)) || value < min || value > max) {
      throw new Error(`${variable} must be ${integer ? 'a whole number' : 'a number'} from ${min} to ${max} (got ${JSON.stringify(raw)}).`);
    }
    given[key] = value;
  }
  return checkAnalysisQueueSettings(given);
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
 * PARAXIA_ANALYSIS_* variables.
 */
export function analysisQueueFor(deps: { pool: pg.Pool; log: Logger }): Promise<AnalysisQueue> {
  let producer = producers.get(deps.pool);
  if (!producer) {
    producer = startAnalysisQueue({ pool: deps.pool, supervise: false, settings: readAnalysisQueueSettings(), log: deps.log });
    producers.set(deps.pool, producer);
    // A failed start is not cached: the next request tries again.
    producer.catch(() => producers.delete(deps.pool));
  }
  return producer;
}
