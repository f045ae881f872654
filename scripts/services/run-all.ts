/**
 * `npm start`: PostgreSQL, fake S3 and fake SMTP with data in .data/, the
 * database migrated and seeded with demo data, the client built, then the web
 * server (and analysis workers, once they exist) as child processes.
 * Ctrl-C stops everything this started.
 */
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import { setPriority } from 'node:os';
import path from 'node:path';
import { createDatabase } from '../../server/db/client';
import { createLogger } from '../../server/services/logger';
import { createObjectStorage } from '../../server/services/object-storage';
import { createPasswordHasher } from '../../server/services/passwords';
import { demoSignInLines, seedDemo } from '../seed/seed-demo';
import { seedAfterDemoAnalyses } from '../seed/seed-after-demo-analyses';
import { buildClient, type ClientBuild } from './client-build';
import { createServiceLog } from './console-log';
import { startNodeProcess, waitForHttp, type RunningNodeProcess } from './node-process';
import { dataRoot, projectRoot, serviceFolders } from './paths';
import { assertPortFree } from './ports';
import { startServiceStack, type ServiceStack } from './service-stack';

const ANALYSIS_WORKER_ENTRY = 'server/workers/analysis-worker.ts';
const WEB_SERVER_ENTRY = 'server/index.ts';

// Node 20 is this project's platform; the SDK's notice about future releases is noise in every process.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

const log = createServiceLog('paraxia');

function portFromEnv(variable: string, fallback: number): number {
  const raw = process.env[variable];
  if (raw === undefined || raw === '') return fallback;
  const port = Number(raw);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    throw new Error(`${variable} must be a whole number between 1 and 65535 (got ${JSON.stringify(raw)}).`);
  }
  return port;
}

function countFromEnv(variable: string, fallback: number): number {
  const raw = process.env[variable];
  if (raw === undefined || raw === '') return fallback;
  const count = Number(raw);
  if (!Number.isInteger(count) || count < 0) throw new Error(`${variable} must be a whole number of 0 or more (got ${JSON.stringify(raw)}).`);
  return count;
}

let stack: ServiceStack | undefined;
let clientBuild: ClientBuild | undefined;
let webServer: RunningNodeProcess | undefined;
const workers: RunningNodeProcess[] = [];
let stopping = false;
let startup: Promise<void> = Promise.resolve();

let lockFile: string | undefined;

/** One `npm start` per data folder: a second one would restart the first one's PostgreSQL. */
async function takeRunLock(folder: string): Promise<void> {
  await mkdir(folder, { recursive: true });
  const file = path.join(folder, 'run-all.pid');
  if (existsSync(file)) {
    const pid = Number(readFileSync(file, 'utf8').trim());
    let alive = false;
    if (Number.isInteger(pid) && pid > 0 && pid !== process.pid) {
      try {
        // The PID may have been reused after a crash: only a run-all process counts.
        alive = readFileSync(`/proc/${pid}/cmdline`, 'utf8').includes('run-all');
      } catch {
        alive = false;
      }
    }
    if (alive) throw new Error(`Paraxia is already running from ${folder} (process ${pid}); stop it first, or set PARAXIA_DATA_DIR to another folder.`);
  }
  writeFileSync(file, `${process.pid}\n`);
  lockFile = file;
}

async function stopEverything(exitCode: number): Promise<never> {
  if (stopping) return new Promise<never>(() => undefined);
  stopping = true;
  log.step('Stopping');
  clientBuild?.cancel();
  await startup.catch(() => undefined);
  await Promise.all(workers.map((worker) => worker.stop()));
  await webServer?.stop();
  if (stack) {
    try {
      await stack.stop();
    } catch (error) {
      log.error((error as Error).message);
      exitCode = exitCode || 1;
    }
  }
  if (lockFile) rmSync(lockFile, { force: true });
  log.step('Stopped');
  process.exit(exitCode);
}

async function main(): Promise<void> {
  const folders = serviceFolders(process.env.PARAXIA_DATA_DIR ? path.resolve(process.env.PARAXIA_DATA_DIR) : dataRoot);
  const webPort = portFromEnv('PORT', 8080);
  const postgresPort = portFromEnv('PARAXIA_PG_PORT', 54329);
  const objectStorePort = portFromEnv('PARAXIA_S3_PORT', 9329);
  const mailPort = portFromEnv('PARAXIA_SMTP_PORT', 2529);
  const workerCount = countFromEnv('PARAXIA_ANALYSIS_WORKERS', 1);
  const workerNice = countFromEnv('PARAXIA_ANALYSIS_WORKER_NICE', 10);

  await takeRunLock(folders.root);
  await assertPortFree(webPort, 'the web server', 'PORT');
  await assertPortFree(objectStorePort, 'the fake S3 server', 'PARAXIA_S3_PORT');
  await assertPortFree(mailPort, 'the fake SMTP server', 'PARAXIA_SMTP_PORT');

  // The client builds while the services start; both take a few seconds.
  if (process.env.PARAXIA_SKIP_CLIENT_BUILD !== '1') clientBuild = buildClient(log);

  stack = await startServiceStack({
    folders,
    postgresPort,
    objectStorePort,
    mailPort,
    database: 'paraxia',
    bucket: 'paraxia',
    log,
  });
  if (stopping) return;

  const passwordHashRounds = countFromEnv('PASSWORD_HASH_ROUNDS', 12);
  // Frame uploads of the demo measurements run a few at a time, each with its own transaction.
  const { pool, db } = createDatabase({ databaseUrl: stack.env.DATABASE_URL, maxConnections: 5 });
  const storage = createObjectStorage({
    S3_ENDPOINT: stack.env.S3_ENDPOINT,
    S3_REGION: stack.env.S3_REGION,
    S3_BUCKET: stack.env.S3_BUCKET,
    S3_ACCESS_KEY_ID: stack.env.S3_ACCESS_KEY_ID,
    S3_SECRET_ACCESS_KEY: stack.env.S3_SECRET_ACCESS_KEY,
    S3_FORCE_PATH_STYLE: true,
  });
  try {
    await seedDemo({
      db,
      passwords: createPasswordHasher({ rounds: passwordHashRounds }),
      report: (m) => log.step(`Seed: ${m}`),
      services: { pool, storage, log: createLogger({ level: 'warn', name: 'seed' }) },
      publicBaseUrl: process.env.PUBLIC_BASE_URL || `http://localhost:${webPort}`,
    });
  } finally {
    storage.close();
    await pool.end();
  }

  await clientBuild?.done;
  if (stopping) return;

  const publicBaseUrl = process.env.PUBLIC_BASE_URL || `http://localhost:${webPort}`;
  const childEnv: NodeJS.ProcessEnv = {
    ...process.env,
    ...stack.env,
    NODE_ENV: process.env.NODE_ENV || 'development',
    PORT: String(webPort),
    PUBLIC_BASE_URL: publicBaseUrl,
    CLIENT_DIST_DIR: process.env.CLIENT_DIST_DIR || path.join(projectRoot, 'dist'),
  };

  webServer = startNodeProcess({ name: 'web server', entry: WEB_SERVER_ENTRY, env: childEnv });
  void webServer.exited.then((code) => {
    if (!stopping) {
      log.error(`The web server stopped unexpectedly (exit ${code}); stopping everything.`);
      void stopEverything(1);
    }
  });
  await waitForHttp(`http://127.0.0.1:${webPort}/api/health`, { timeoutMs: 60_000, process: webServer });

  // Hook for the background analysis workers: started once their entry point exists.
  if (existsSync(path.join(projectRoot, ANALYSIS_WORKER_ENTRY))) {
    for (let i = 1; i <= workerCount; i += 1) {
      const worker = startNodeProcess({ name: `analysis worker ${i}`, entry: ANALYSIS_WORKER_ENTRY, env: childEnv });
      // Analysis is batch work; the web answers people. A lower CPU priority keeps pages quick while sweeps are analysed.
      setWorkerPriority(worker.pid, workerNice);
      workers.push(worker);
      void worker.exited.then((code) => {
        if (!stopping) log.warn(`${worker.name} stopped (exit ${code}); the web server keeps running.`);
      });
    }
    log.step(`Started ${workerCount} analysis worker(s)`);
    void seedReviewHistoryInBackground(stack.env.DATABASE_URL, stack.env, publicBaseUrl);
  }

  const lines = [
    '',
    `Paraxia is running at ${publicBaseUrl}`,
    `  PostgreSQL   ${stack.env.DATABASE_URL}  (data: ${path.relative(projectRoot, folders.postgresData) || folders.postgresData})`,
    `  Fake S3      ${stack.env.S3_ENDPOINT}  bucket ${stack.env.S3_BUCKET}  (data: ${path.relative(projectRoot, folders.objectStore)})`,
    `  Fake SMTP    127.0.0.1:${stack.env.SMTP_PORT}  (kept mail: ${path.relative(projectRoot, folders.mailStore)})`,
    '',
    ...demoSignInLines(),
    '',
    'Press Ctrl-C to stop.',
    '',
  ];
  process.stdout.write(lines.join('\n'));
}

function setWorkerPriority(pid: number, nice: number): void {
  try {
    setPriority(pid, Math.min(19, nice));
  } catch (error) {
    log.warn(`Could not lower the analysis worker's priority: ${error instanceof Error ? error.message : String(error)}`);
  }
}

/** Once the workers have analysed the demo sweeps: submissions, a return, approvals and certificates. */
async function seedReviewHistoryInBackground(databaseUrl: string, env: ServiceStack['env'], publicBaseUrl: string): Promise<void> {
  const { pool, db } = createDatabase({ databaseUrl, maxConnections: 2 });
  const storage = createObjectStorage({
    S3_ENDPOINT: env.S3_ENDPOINT,
    S3_REGION: env.S3_REGION,
    S3_BUCKET: env.S3_BUCKET,
    S3_ACCESS_KEY_ID: env.S3_ACCESS_KEY_ID,
    S3_SECRET_ACCESS_KEY: env.S3_SECRET_ACCESS_KEY,
    S3_FORCE_PATH_STYLE: true,
  });
  try {
    await seedAfterDemoAnalyses({
      deps: { db, storage, log: createLogger({ level: 'warn', name: 'seed' }), env: { PUBLIC_BASE_URL: publicBaseUrl } },
      report: (m) => log.step(`Seed: ${m}`),
      isStopping: () => stopping,
    });
  } catch (error) {
    if (!stopping) log.warn(`The demo review history could not be seeded: ${error instanceof Error ? error.message : String(error)}`);
  } finally {
    storage.close();
    await pool.end();
  }
}

process.on('SIGINT', () => void stopEverything(0));
process.on('SIGTERM', () => void stopEverything(0));
process.on('SIGHUP', () => void stopEverything(0));

startup = main();
startup.catch((error: Error) => {
  log.error(error.message);
  void stopEverything(1);
});
