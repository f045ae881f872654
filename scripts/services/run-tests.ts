/**
 * `npm test`: the same services as `npm start`, but in a throw-away folder
 * (.data/test-<random>) on free loopback ports, with a fresh database and
 * bucket; then `vitest run` (extra arguments are passed on); then everything
 * is stopped and the folder deleted, whatever the outcome. Exit code = vitest's.
 */
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { mkdir, readFile, rm } from 'node:fs/promises';
import path from 'node:path';
import { createServiceLog } from './console-log';
import { dataRoot, projectRoot, serviceFolders } from './paths';
import { findFreePort } from './ports';
import { findPostgresBinDir } from './postgres';
import { runCommand } from './run-command';
import { startServiceStack, type ServiceStack } from './service-stack';

const STALE_TEST_FOLDER_MS = 3 * 60 * 60 * 1000;
// Node 20 is this project's platform; the SDK's notice about future releases is noise in every process.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

const log = createServiceLog('paraxia test');

function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

/** Removes test folders that a killed run (SIGKILL, power loss) left behind. */
async function removeStaleTestFolders(): Promise<void> {
  if (!existsSync(dataRoot)) return;
  for (const name of readdirSync(dataRoot)) {
    if (!name.startsWith('test-')) continue;
    const folder = path.join(dataRoot, name);
    if (Date.now() - statSync(folder).mtimeMs < STALE_TEST_FOLDER_MS) continue;
    const pidFile = path.join(folder, 'pg', 'postmaster.pid');
    if (existsSync(pidFile)) {
      const pid = Number((await readFile(pidFile, 'utf8')).split('\n')[0]);
      if (Number.isInteger(pid) && pid > 0 && processIsAlive(pid)) {
        const pgCtl = path.join(findPostgresBinDir(), 'pg_ctl');
        const asRoot = process.getuid?.() === 0;
        const args = ['stop', '-D', path.join(folder, 'pg'), '-m', 'immediate', '-w'];
        await runCommand(asRoot ? 'runuser' : pgCtl, asRoot ? ['-u', 'postgres', '--', pgCtl, ...args] : args);
      }
    }
    await rm(folder, { recursive: true, force: true });
    log.step(`Removed a stale test folder ${name}`);
  }
}

async function main(): Promise<number> {
  const vitestArgs = process.argv.slice(2);
  const folders = serviceFolders(path.join(dataRoot, `test-${randomBytes(4).toString('hex')}`));
  let stack: ServiceStack | undefined;
  let vitestPid: number | undefined;
  let interrupted = false;

  const onSignal = (signal: NodeJS.Signals) => {
    interrupted = true;
    if (vitestPid) process.kill(vitestPid, signal);
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);

  try {
    await mkdir(dataRoot, { recursive: true });
    await removeStaleTestFolders();
    stack = await startServiceStack({
      folders,
      postgresPort: await findFreePort(),
      objectStorePort: 0,
      mailPort: 0,
      database: 'paraxia_test',
      bucket: 'paraxia-test',
      unsafeFastWrites: true,
      log,
    });
    if (interrupted) return 130;

    const scratchDir = path.join(folders.root, 'scratch');
    await mkdir(scratchDir, { recursive: true });
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      ...stack.env,
      NODE_ENV: 'test',
      LOG_LEVEL: process.env.PARAXIA_TEST_LOG_LEVEL || 'silent',
      SESSION_SECRET: randomBytes(32).toString('hex'),
      PASSWORD_HASH_ROUNDS: '4',
      PARAXIA_TEST_SERVICES: '1',
      PARAXIA_TEST_SCRATCH_DIR: scratchDir,
      PARAXIA_TEST_PG_ADMIN_URL: stack.postgres.urlFor('postgres'),
    };

    log.step(`Running vitest ${vitestArgs.join(' ')}`.trim());
    // A JSON report beside the usual output gives the plain "N passed, N failed" closing line.
    const summaryFile = path.join(scratchDir, 'vitest-summary.json');
    const reporters = ['--reporter=default', '--reporter=json', `--outputFile.json=${summaryFile}`];
    const vitest = spawn(process.execPath, [path.join(projectRoot, 'node_modules', 'vitest', 'vitest.mjs'), 'run', ...reporters, ...vitestArgs], {
      cwd: projectRoot,
      env,
      stdio: ['ignore', 'inherit', 'inherit'],
    });
    vitestPid = vitest.pid;
    const exitCode = await new Promise<number>((resolve) => {
      vitest.on('exit', (code, signal) => resolve(code ?? (signal ? 130 : 1)));
      vitest.on('error', (error) => {
        log.error(`vitest could not start: ${error.message}`);
        resolve(1);
      });
    });
    await printSummaryLine(summaryFile);
    return exitCode;
  } catch (error) {
    log.error((error as Error).message);
    return 1;
  } finally {
    if (stack) {
      try {
        await stack.stop();
      } catch (error) {
        log.error((error as Error).message);
      }
    }
    await rm(folders.root, { recursive: true, force: true });
    log.step('Services stopped and the throw-away data folder removed');
  }
}

/** The plain closing line: "N passed, N failed, N skipped", from vitest's JSON report. */
async function printSummaryLine(file: string): Promise<void> {
  try {
    const report = JSON.parse(await readFile(file, 'utf8')) as Record<string, number>;
    const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
    process.stdout.write(`\n${report.numPassedTests} passed, ${report.numFailedTests} failed, ${skipped} skipped\n`);
  } catch {
    // No report (vitest did not start or was stopped): its exit code already says so.
  }
}

main().then(
  (code) => process.exit(code),
  (error: Error) => {
    log.error(error.message);
    process.exit(1);
  },
);
