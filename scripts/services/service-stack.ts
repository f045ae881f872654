import { chmod, mkdir } from 'node:fs/promises';
import { applyMigrations } from '../../server/db/migrate';
import { createObjectStorage } from '../../server/services/object-storage';
import type { ServiceLog } from './console-log';
import { startFakeS3, type RunningFakeS3 } from './fake-s3';
import { startMailCatcher, type RunningMailCatcher } from './mail-catcher';
import type { ServiceFolders } from './paths';
import { clusterOwnerCanReach, ensureDatabase, startPostgres, type RunningPostgres } from './postgres';

export interface ServiceStackOptions {
  folders: ServiceFolders;
  postgresPort: number;
  /** 0 picks a free port. */
  objectStorePort: number;
  /** 0 picks a free port. */
  mailPort: number;
  database: string;
  bucket: string;
  unsafeFastWrites?: boolean;
  log: ServiceLog;
}

export interface ServiceStack {
  postgres: RunningPostgres;
  objectStore: RunningFakeS3;
  mail: RunningMailCatcher;
  /** The variables server/env.ts reads to reach these services. */
  env: Record<string, string>;
  stop(): Promise<void>;
}

/** PostgreSQL (child processes, via pg_ctl), fake S3 and fake SMTP (in this
 * process), the database created and migrated, the bucket created. On any
 * failure whatever was already started is stopped again. */
export async function startServiceStack(options: ServiceStackOptions): Promise<ServiceStack> {
  const { folders, log } = options;
  const started: { name: string; stop: () => Promise<void> }[] = [];
  const stopAll = async () => {
    const problems: string[] = [];
    for (const service of started.reverse()) {
      try {
        await service.stop();
      } catch (error) {
        problems.push(`${service.name}: ${(error as Error).message}`);
      }
    }
    started.length = 0;
    if (problems.length > 0) throw new Error(`Some services did not stop cleanly:\n${problems.join('\n')}`);
  };

  try {
    await mkdir(folders.root, { recursive: true });
    await chmod(folders.root, 0o755);
    if (!(await clusterOwnerCanReach(folders.root))) {
      throw new Error(
        `The postgres user cannot reach ${folders.root}; every parent folder must be traversable (chmod o+x), or set PARAXIA_DATA_DIR to a folder it can reach.`,
      );
    }

    log.step(`Starting PostgreSQL on 127.0.0.1:${options.postgresPort}`);
    const postgres = await startPostgres({
      dataDir: folders.postgresData,
      runDir: folders.postgresRun,
      port: options.postgresPort,
      unsafeFastWrites: options.unsafeFastWrites,
      log,
    });
    started.push({ name: 'PostgreSQL', stop: () => postgres.stop() });
    if (await ensureDatabase(postgres, options.database)) log.step(`Created database ${options.database}`);
    const databaseUrl = postgres.urlFor(options.database);
    await applyMigrations({ databaseUrl });

    const objectStore = await startFakeS3({ directory: folders.objectStore, port: options.objectStorePort });
    started.push({ name: 'fake S3', stop: () => objectStore.stop() });
    log.step(`Fake S3 listening on ${objectStore.endpoint}`);

    const mail = await startMailCatcher({ port: options.mailPort, storeDir: folders.mailStore });
    started.push({ name: 'fake SMTP', stop: () => mail.stop() });
    log.step(`Fake SMTP listening on 127.0.0.1:${mail.port}, keeping messages in ${folders.mailStore}`);

    const env: Record<string, string> = {
      DATABASE_URL: databaseUrl,
      S3_ENDPOINT: objectStore.endpoint,
      S3_REGION: 'us-east-1',
      S3_BUCKET: options.bucket,
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
      S3_FORCE_PATH_STYLE: 'true',
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(mail.port),
      SMTP_SECURE: 'false',
      SMTP_IGNORE_TLS: 'true',
      MAIL_STORE_DIR: folders.mailStore,
    };

    const storage = createObjectStorage({
      S3_ENDPOINT: env.S3_ENDPOINT,
      S3_REGION: env.S3_REGION,
      S3_BUCKET: env.S3_BUCKET,
      S3_ACCESS_KEY_ID: env.S3_ACCESS_KEY_ID,
      S3_SECRET_ACCESS_KEY: env.S3_SECRET_ACCESS_KEY,
      S3_FORCE_PATH_STYLE: true,
    });
    try {
      await storage.ensureBucket();
    } finally {
      storage.close();
    }

    return { postgres, objectStore, mail, env, stop: stopAll };
  } catch (error) {
    await stopAll().catch((stopError: Error) => log.error(stopError.message));
    throw error;
  }
}
