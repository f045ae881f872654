/**
 * `npm run load`: starts its own PostgreSQL, fake S3 and fake SMTP in a
 * throw-away folder (as `npm test` does), seeds 300 work orders with lenses
 * and measurements, starts the web server as its own process, signs in 50
 * people, each on its own connection and session, and measures list and
 * detail endpoints for 20 s in two ways: paced (every person sends
 * PARAXIA_LOAD_USER_RATE requests a second, default 2, busier than anyone
 * clicking through pages) and saturated (each sends the next request the
 * moment the last is answered: the server's capacity). Then it requests 4
 * analyses of generated sweeps, starts 2 analysis worker processes and
 * measures the paced load again while they work. Prints p50/p95/p99,
 * throughput and errors per phase; the targets apply to the paced phases; the
 * last line is
 *   load: p95 X ms; errors N; p95 during analysis Y ms
 * Targets: p95 < 100 ms with 0 errors; p95 < 200 ms during analysis.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { mkdir, rm } from 'node:fs/promises';
import { cpus, loadavg, setPriority } from 'node:os';
import path from 'node:path';
import { inArray } from 'drizzle-orm';
import type pg from 'pg';
import { analysisRuns } from '../../server/db/schema';
import { closeDeps, createDeps } from '../../server/deps';
import { parseEnv } from '../../server/env';
import { todayIsoDate } from '../../server/services/equipment';
import { createServiceLog } from '../services/console-log';
import { dataRoot, projectRoot, serviceFolders } from '../services/paths';
import { findFreePort } from '../services/ports';
import { startServiceStack, type ServiceStack } from '../services/service-stack';
import { prepareAnalysisMeasurements } from './prepare-analysis-measurements';
import { runSignedInLoad, type LoadPhaseResult } from './run-signed-in-load';
import { seedLoadData, type LoadData } from './seed-load-data';
import { getAsSession, postAsSession, signInOverHttp, type HttpSession } from './sign-in-over-http';

process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

const WORK_ORDERS = 300;
const USERS = 50;
const PHASE_SECONDS = Number(process.env.PARAXIA_LOAD_SECONDS ?? 20);
const USER_RATE = Number(process.env.PARAXIA_LOAD_USER_RATE ?? 2);
const ANALYSES = 4;
const WORKERS = 2;
const TARGET_P95_MS = 100;
const TARGET_P95_DURING_ANALYSIS_MS = 200;

const log = createServiceLog('paraxia load');
const children: ChildProcess[] = [];

function startNodeProcess(script: string, env: NodeJS.ProcessEnv, name: string, nodeArgs: string[] = []): ChildProcess {
  // node --import tsx (not npx): the PID kept is the server itself, so stopping it stops it.
  const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', script], { cwd: projectRoot, env, stdio: ['ignore', 'ignore', 'inherit'] });
  child.on('exit', (code, signal) => {
    if (!stopping) log.warn(`${name} (pid ${child.pid}) exited early (${signal ?? `code ${code}`}).`);
  });
  children.push(child);
  return child;
}

let stopping = false;
let runningStack: ServiceStack | undefined;
async function stopChildren(): Promise<void> {
  stopping = true;
  await Promise.all(
    children.map(
      (child) =>
        new Promise<void>((resolve) => {
          if (child.exitCode !== null || child.signalCode !== null) return resolve();
          child.once('exit', () => resolve());
          child.kill('SIGTERM');
          setTimeout(() => child.kill('SIGKILL'), 10_000).unref();
        }),
    ),
  );
}

async function waitForHealth(baseUrl: string, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      const response = await fetch(`${baseUrl}/api/health`);
      await response.arrayBuffer();
      if (response.ok) return;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) throw new Error(`The web server at ${baseUrl} did not answer /api/health within ${timeoutMs} ms.`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

/** The mix a lab's day looks like: the work-order list with filters, search and sort, detail pages, the register. */
function requestMix(data: LoadData): () => string {
  const pick = <T>(items: readonly T[]) => items[Math.floor(Math.random() * items.length)];
  const lists = [
    () => `/api/work-orders?page=${1 + Math.floor(Math.random() * 12)}&pageSize=25`,
    () => `/api/work-orders?status=open,in-progress&sort=dueDate&order=asc`,
    () => `/api/work-orders?q=${encodeURIComponent(pick(data.searchTerms))}`,
    () => `/api/work-orders?sort=organisation&order=desc&dueAfter=${todayIsoDate()}`,
  ];
  const details = [() => `/api/work-orders/${pick(data.workOrderIds)}`, () => `/api/measurements/${pick(data.measurementIds)}`];
  return () => {
    const roll = Math.random();
    if (roll < 0.4) return pick(lists)();
    if (roll < 0.85) return pick(details)();
    return '/api/equipment';
  };
}

/** CPU time (user + system) a process has used so far, from /proc (Linux), in ms. */
function processCpuMs(pid: number | undefined): number | undefined {
  if (!pid) return undefined;
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1].split(' ');
    // Fields 14 and 15 of proc(5), utime and stime, in clock ticks (100 per second on Linux).
    return ((Number(fields[11]) + Number(fields[12])) * 1000) / 100;
  } catch {
    return undefined;
  }
}

/** CPU time of PostgreSQL: the postmaster (first line of postmaster.pid) and every process it started. */
function postgresCpuMs(dataDir: string): number | undefined {
  try {
    const postmaster = Number(readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n')[0]);
    let total = processCpuMs(postmaster) ?? 0;
    for (const entry of readdirSync('/proc')) {
      if (!/^\d+$/.test(entry)) continue;
      try {
        const fields = readFileSync(`/proc/${entry}/stat`, 'utf8').split(') ')[1].split(' ');
        // Field 4 of proc(5) is the parent's pid.
        if (Number(fields[1]) === postmaster) total += processCpuMs(Number(entry)) ?? 0;
      } catch {
        // the process ended meanwhile
      }
    }
    return total;
  } catch {
    return undefined;
  }
}

/** PostgreSQL's own counters (pg_stat_database, pg_stat_user_tables): statements and rows read by sequential scans. */
async function databaseCounters(pool: pg.Pool): Promise<{ transactions: number; seqRowsByTable: Map<string, number> }> {
  const [database, tables] = await Promise.all([
    pool.query<{ xact_commit: string }>('select xact_commit from pg_stat_database where datname = current_database()'),
    pool.query<{ relname: string; seq_tup_read: string }>('select relname, seq_tup_read from pg_stat_user_tables'),
  ]);
  return {
    transactions: Number(database.rows[0].xact_commit),
    seqRowsByTable: new Map(tables.rows.map((row) => [row.relname, Number(row.seq_tup_read)])),
  };
}

/** Per request: statements run (each outside a transaction is one) and the tables read most by sequential scans. */
async function describeDatabaseWork(pool: pg.Pool, before: Awaited<ReturnType<typeof databaseCounters>>, requests: number): Promise<string> {
  // The statistics collector reports with a short delay (PostgreSQL manual, "The Cumulative Statistics System").
  await new Promise((resolve) => setTimeout(resolve, 1000));
  const after = await databaseCounters(pool);
  const scans = [...after.seqRowsByTable]
    .map(([table, rows]) => [table, (rows - (before.seqRowsByTable.get(table) ?? 0)) / requests] as const)
    .filter(([, rows]) => rows >= 1)
    .sort((a, b) => b[1] - a[1])
    .slice(0, 4)
    .map(([table, rows]) => `${table} ${rows.toFixed(0)}`);
  return `  database per request: ${((after.transactions - before.transactions) / requests).toFixed(1)} transactions; rows read by sequential scans: ${scans.join(', ') || 'none'}\n`;
}

interface PhaseCpu {
  webMsPerRequest?: number;
  postgresMsPerRequest?: number;
}

async function measuredPhase(webPid: number | undefined, postgresDataDir: string, run: () => Promise<LoadPhaseResult>): Promise<{ result: LoadPhaseResult; cpu: PhaseCpu }> {
  const webBefore = processCpuMs(webPid);
  const postgresBefore = postgresCpuMs(postgresDataDir);
  const result = await run();
  const webAfter = processCpuMs(webPid);
  const postgresAfter = postgresCpuMs(postgresDataDir);
  // PostgreSQL's CPU is summed over its live processes: backends that ended during the phase (the workers' connections) take their time with them, so a falling sum is no figure.
  const perRequest = (before?: number, after?: number) =>
    before !== undefined && after !== undefined && after >= before ? (after - before) / result.requests : undefined;
  return { result, cpu: { webMsPerRequest: perRequest(webBefore, webAfter), postgresMsPerRequest: perRequest(postgresBefore, postgresAfter) } };
}

function printPhase(name: string, result: LoadPhaseResult, cpu: PhaseCpu): void {
  const f = (ms: number) => ms.toFixed(1);
  process.stdout.write(
    `${name}: ${result.requests} requests in ${result.durationSeconds} s (${result.requestsPerSecond.toFixed(0)}/s); ` +
      `latency p50 ${f(result.p50Ms)} ms, p95 ${f(result.p95Ms)} ms, p99 ${f(result.p99Ms)} ms, max ${f(result.maxMs)} ms; ` +
      `errors ${result.errors}; statuses ${JSON.stringify(result.statusCounts)}\n` +
      `  p95 by request (ms): ${JSON.stringify(result.p95MsByKind)}\n` +
      `  CPU per request (steadier than wall time on a shared machine): web ${cpu.webMsPerRequest?.toFixed(2) ?? '?'} ms, PostgreSQL ${cpu.postgresMsPerRequest?.toFixed(2) ?? '?'} ms\n`,
  );
}

async function main(): Promise<number> {
  const folders = serviceFolders(path.join(dataRoot, `test-load-${randomBytes(4).toString('hex')}`));
  let stack: ServiceStack | undefined;
  let deps: ReturnType<typeof createDeps> | undefined;
  try {
    await mkdir(dataRoot, { recursive: true });
    stack = await startServiceStack({
      folders,
      postgresPort: await findFreePort(),
      objectStorePort: 0,
      mailPort: 0,
      database: 'paraxia_load',
      bucket: 'paraxia-load',
      unsafeFastWrites: true,
      log,
    });
    runningStack = stack;
    const webPort = await findFreePort();
    const baseUrl = `http://127.0.0.1:${webPort}`;
    const scratchDir = path.join(folders.root, 'scratch');
    await mkdir(scratchDir, { recursive: true });
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      ...stack.env,
      NODE_ENV: 'development',
      HOST: '127.0.0.1',
      PORT: String(webPort),
      PUBLIC_BASE_URL: baseUrl,
      LOG_LEVEL: process.env.PARAXIA_LOAD_LOG_LEVEL ?? 'warn',
      SESSION_SECRET: randomBytes(32).toString('hex'),
      PASSWORD_HASH_ROUNDS: '4',
      PARAXIA_ANALYSIS_QUEUE_NAME: `analyse-load-${randomBytes(3).toString('hex')}`,
      PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5',
      PARAXIA_ANALYSIS_SCRATCH_DIR: scratchDir,
    };

    const today = todayIsoDate();
    deps = createDeps(parseEnv(env));
    let started = Date.now();
    const data = await seedLoadData(deps.db, { workOrders: WORK_ORDERS, today });
    log.step(`Seeded ${data.workOrderIds.length} work orders, ${data.workOrderIds.length * 2} lenses, ${data.measurementIds.length} measurements and ${data.people.length} people in ${Date.now() - started} ms`);
    started = Date.now();
    const analysisMeasurementIds = await prepareAnalysisMeasurements(deps, { data, count: ANALYSES, today, report: (message) => log.step(message) });
    log.step(`Stored the frames of ${ANALYSES} sweeps to analyse in ${Date.now() - started} ms`);
    // A database in use has planner statistics (autovacuum gathers them); freshly bulk-loaded tables do not yet.
    await deps.pool.query('analyze');

    // PARAXIA_LOAD_PROFILE_DIR=<folder> writes a V8 CPU profile of the web process there (open it in Chrome's DevTools).
    const profileDir = process.env.PARAXIA_LOAD_PROFILE_DIR;
    const web = startNodeProcess('server/index.ts', env, 'web server', profileDir ? ['--cpu-prof', `--cpu-prof-dir=${profileDir}`] : []);
    await waitForHealth(baseUrl, 60_000);
    const sessions: HttpSession[] = [];
    for (const person of data.people.slice(0, USERS)) sessions.push(await signInOverHttp(baseUrl, person));
    log.step(`Signed in ${sessions.length} people (distinct sessions); web server at ${baseUrl}`);

    const nextPath = requestMix(data);
    await runSignedInLoad({ baseUrl, sessions, durationSeconds: 3, nextPath });
    log.step(`Warmed up; ${PHASE_SECONDS} s with ${sessions.length} connections (machine: ${cpus().length} cores, load average ${loadavg()[0].toFixed(1)})`);
    const quietPhase = await measuredPhase(web.pid, folders.postgresData, () =>
      runSignedInLoad({ baseUrl, sessions, durationSeconds: PHASE_SECONDS, nextPath, requestsPerSecondPerUser: USER_RATE }),
    );
    const quiet = quietPhase.result;
    printPhase(`lists and details, ${sessions.length} people at ${USER_RATE} requests/s each`, quiet, quietPhase.cpu);
    const countersBefore = await databaseCounters(deps.pool);
    const saturatedPhase = await measuredPhase(web.pid, folders.postgresData, () => runSignedInLoad({ baseUrl, sessions, durationSeconds: PHASE_SECONDS, nextPath }));
    printPhase(`lists and details, saturated (${sessions.length} connections, no pause: capacity, no target)`, saturatedPhase.result, saturatedPhase.cpu);
    process.stdout.write(await describeDatabaseWork(deps.pool, countersBefore, saturatedPhase.result.requests));

    // PARAXIA_LOAD_WORKER_NICE=<0..19> lowers the workers' CPU priority (setpriority(2)), to see what that does for the web.
    const workerNice = Number(process.env.PARAXIA_LOAD_WORKER_NICE ?? 10); // as npm start runs them
    for (let i = 0; i < WORKERS; i++) {
      const worker = startNodeProcess('server/workers/analysis-worker.ts', env, `analysis worker ${i + 1}`);
      if (workerNice > 0 && worker.pid) setPriority(worker.pid, workerNice);
    }
    const technician = sessions[0];
    for (const measurementId of analysisMeasurementIds) {
      const requested = await postAsSession(baseUrl, technician, `/api/measurements/${measurementId}/analyses`, {});
      if (requested.status !== 202) throw new Error(`Requesting the analysis of ${measurementId} answered ${requested.status}: ${JSON.stringify(requested.body)}`);
    }
    const runStatuses = async () =>
      (await deps!.db.select({ status: analysisRuns.status }).from(analysisRuns).where(inArray(analysisRuns.measurementId, analysisMeasurementIds))).map((row) => row.status);
    const waitStart = Date.now();
    while (!(await runStatuses()).includes('running')) {
      if (Date.now() - waitStart > 60_000) throw new Error('No analysis started within 60 s of being requested; are the workers running?');
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
    log.step(`${ANALYSES} analyses requested and running on ${WORKERS} workers${workerNice > 0 ? ` (nice ${workerNice})` : ''}; ${PHASE_SECONDS} s with ${sessions.length} connections`);
    const busyPhase = await measuredPhase(web.pid, folders.postgresData, () =>
      runSignedInLoad({ baseUrl, sessions, durationSeconds: PHASE_SECONDS, nextPath, requestsPerSecondPerUser: USER_RATE }),
    );
    const busy = busyPhase.result;
    const finishedDuring = (await runStatuses()).filter((status) => status === 'succeeded' || status === 'failed').length;
    printPhase(`lists and details during analysis, ${sessions.length} people at ${USER_RATE} requests/s each`, busy, busyPhase.cpu);

    const settleStart = Date.now();
    let statuses = await runStatuses();
    while (statuses.some((status) => status === 'queued' || status === 'running') && Date.now() - settleStart < 300_000) {
      await new Promise((resolve) => setTimeout(resolve, 500));
      statuses = await runStatuses();
    }
    const check = await getAsSession(baseUrl, technician, `/api/measurements/${analysisMeasurementIds[0]}`);
    const focalLengthMm = check.body?.measurement?.currentAnalysis?.result?.focalLengthMm;
    process.stdout.write(
      `analyses: ${statuses.filter((s) => s === 'succeeded').length} of ${ANALYSES} succeeded (${finishedDuring} finished inside the ${PHASE_SECONDS} s window, all within ${((Date.now() - waitStart) / 1000).toFixed(0)} s); first f = ${focalLengthMm ?? 'n/a'} mm\n`,
    );
    const verdict = (value: number, target: number) => (value < target ? `meets < ${target} ms` : `MISSES < ${target} ms`);
    process.stdout.write(`targets: p95 ${verdict(quiet.p95Ms, TARGET_P95_MS)}; errors ${quiet.errors + saturatedPhase.result.errors + busy.errors === 0 ? 'none' : 'SOME'}; during analysis ${verdict(busy.p95Ms, TARGET_P95_DURING_ANALYSIS_MS)}\n`);
    process.stdout.write(`load: p95 ${quiet.p95Ms.toFixed(1)} ms; errors ${quiet.errors + saturatedPhase.result.errors + busy.errors}; p95 during analysis ${busy.p95Ms.toFixed(1)} ms\n`);
    return 0;
  } finally {
    await stopChildren();
    if (deps) await closeDeps(deps).catch(() => undefined);
    if (stack) await stack.stop().catch((error: Error) => log.error(error.message));
    await rm(folders.root, { recursive: true, force: true });
  }
}

process.on('SIGINT', () => {
  log.warn('Interrupted: stopping the web server, workers and services.');
  void Promise.all([stopChildren(), runningStack?.stop().catch(() => undefined)]).then(() => process.exit(130));
});

main().then(
  (code) => process.exit(code),
  (error: Error) => {
    log.error(error.stack ?? error.message);
    process.exit(1);
  },
);
