import { existsSync, readdirSync } from 'node:fs';
import { chmod, chown, mkdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import pg from 'pg';
import type { ServiceLog } from './console-log';
import { runCommand } from './run-command';

export const POSTGRES_USER = 'app';
export const POSTGRES_HOST = '127.0.0.1';

export interface PostgresOptions {
  dataDir: string;
  /** Socket folder; its path plus "/.s.PGSQL.<port>" must stay under ~100 characters. */
  runDir: string;
  port: number;
  /** fsync and friends off: fast and unsafe, for throw-away test clusters only. */
  unsafeFastWrites?: boolean;
  log: ServiceLog;
}

export interface RunningPostgres {
  port: number;
  logFile: string;
  /** postgres://app@127.0.0.1:<port>/<database> */
  urlFor(database: string): string;
  stop(options?: { mode?: 'smart' | 'fast' | 'immediate' }): Promise<void>;
}

/** The newest installed server's bin folder, e.g. /usr/lib/postgresql/15/bin. */
export function findPostgresBinDir(root = '/usr/lib/postgresql'): string {
  const versions = existsSync(root)
    ? readdirSync(root)
        .filter((name) => existsSync(path.join(root, name, 'bin', 'postgres')))
        .sort((a, b) => Number(b) - Number(a))
    : [];
  if (versions.length === 0) {
    throw new Error(`No PostgreSQL server found under ${root}; install it with: apt-get install -y postgresql`);
  }
  return path.join(root, versions[0], 'bin');
}

const runningAsRoot = typeof process.getuid === 'function' && process.getuid() === 0;

/** initdb and postgres refuse to run as root, so as root they run as the postgres user. */
function asClusterOwner(command: string, args: string[]): [string, string[]] {
  return runningAsRoot ? ['runuser', ['-u', 'postgres', '--', command, ...args]] : [command, args];
}

async function runAsClusterOwner(command: string, args: string[]) {
  const [program, programArgs] = asClusterOwner(command, args);
  // detached: a new process group, so the terminal's Ctrl-C reaches only the
  // orchestrator, which then stops PostgreSQL in order with pg_ctl.
  return runCommand(program, programArgs, { detached: true });
}

async function postgresUserIds(): Promise<{ uid: number; gid: number }> {
  const result = await runCommand('id', ['postgres']);
  const uid = /uid=(\d+)/.exec(result.stdout)?.[1];
  const gid = /gid=(\d+)/.exec(result.stdout)?.[1];
  if (result.exitCode !== 0 || !uid || !gid) {
    throw new Error('There is no "postgres" system user; install Debian\'s postgresql package (apt-get install -y postgresql).');
  }
  return { uid: Number(uid), gid: Number(gid) };
}

async function prepareFolder(folder: string, owner: { uid: number; gid: number } | null): Promise<void> {
  await mkdir(folder, { recursive: true });
  if (owner) await chown(folder, owner.uid, owner.gid);
  await chmod(folder, 0o700);
}

/** Whether the user that runs PostgreSQL can enter `folder` (every parent must be traversable). */
export async function clusterOwnerCanReach(folder: string): Promise<boolean> {
  if (!runningAsRoot) return true;
  const result = await runCommand('runuser', ['-u', 'postgres', '--', 'test', '-x', folder]);
  return result.exitCode === 0;
}

async function logTail(logFile: string, lines = 15): Promise<string> {
  try {
    return (await readFile(logFile, 'utf8')).trimEnd().split('\n').slice(-lines).join('\n');
  } catch {
    return '';
  }
}

async function clusterIsRunning(binDir: string, dataDir: string): Promise<boolean> {
  const result = await runAsClusterOwner(path.join(binDir, 'pg_ctl'), ['status', '-D', dataDir]);
  return result.exitCode === 0;
}

export async function startPostgres(options: PostgresOptions): Promise<RunningPostgres> {
  const { dataDir, runDir, port, log } = options;
  const binDir = findPostgresBinDir();
  const pgCtl = path.join(binDir, 'pg_ctl');
  const logFile = path.join(runDir, 'postgres.log');
  const owner = runningAsRoot ? await postgresUserIds() : null;

  if (`${runDir}/.s.PGSQL.${port}`.length > 100) {
    throw new Error(`The PostgreSQL socket folder path is too long (${runDir}); move the project to a shorter path.`);
  }

  await prepareFolder(runDir, owner);
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    await prepareFolder(dataDir, owner);
    log.step(`Creating a PostgreSQL cluster in ${dataDir}`);
    const init = await runAsClusterOwner(path.join(binDir, 'initdb'), [
      '-D', dataDir, '-U', POSTGRES_USER, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8',
    ]);
    if (init.exitCode !== 0) {
      throw new Error(
        `initdb failed for ${dataDir} (every parent folder must be traversable by the postgres user):\n${init.stderr || init.stdout}`,
      );
    }
  } else if (owner) {
    // A checkout copied or restored by root may have lost the ownership.
    await runCommand('chown', ['-R', `${owner.uid}:${owner.gid}`, dataDir]);
  }

  if (await clusterIsRunning(binDir, dataDir)) {
    log.warn('A PostgreSQL server left running by an earlier run uses this data folder; restarting it.');
    await runAsClusterOwner(pgCtl, ['stop', '-D', dataDir, '-m', 'fast', '-w']);
  }

  const serverSettings = [`-c listen_addresses=${POSTGRES_HOST}`, `-p ${port}`, `-k ${runDir}`];
  if (options.unsafeFastWrites) {
    serverSettings.push('-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off');
  }
  const start = await runAsClusterOwner(pgCtl, ['start', '-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', serverSettings.join(' ')]);
  if (start.exitCode !== 0) {
    throw new Error(`PostgreSQL did not start on port ${port} (log: ${logFile}):\n${start.stderr || start.stdout}\n${await logTail(logFile)}`);
  }

  let stopped = false;
  return {
    port,
    logFile,
    urlFor: (database) => `postgres://${POSTGRES_USER}@${POSTGRES_HOST}:${port}/${database}`,
    async stop(stopOptions = {}) {
      if (stopped) return;
      stopped = true;
      const result = await runAsClusterOwner(pgCtl, ['stop', '-D', dataDir, '-m', stopOptions.mode ?? 'fast', '-w', '-t', '60']);
      if (result.exitCode !== 0 && (await clusterIsRunning(binDir, dataDir))) {
        throw new Error(`PostgreSQL did not stop:\n${result.stderr || result.stdout}`);
      }
    },
  };
}

/** Creates the database when missing; returns true when it was created. */
export async function ensureDatabase(server: RunningPostgres, database: string): Promise<boolean> {
  if (!/^[a-z_][a-z0-9_]*$/.test(database)) {
    throw new Error(`Database name "${database}" must be lower-case letters, digits and underscores.`);
  }
  const client = new pg.Client({ connectionString: server.urlFor('postgres') });
  await client.connect();
  try {
    const existing = await client.query('select 1 from pg_database where datname = $1', [database]);
    if (existing.rowCount) return false;
    await client.query(`create database "${database}"`);
    return true;
  } finally {
    await client.end();
  }
}
