/**
 * The built client for browser tests: `vite build` into a folder of this
 * test run's scratch space, once per `npm test` however many browser test
 * files ask for it (the scratch folder is new on every run, so a build never
 * outlives the source it was made from).
 */
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdir, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';

const projectRoot = path.resolve(import.meta.dirname, '../..');

export interface BuildClientOnceOptions {
  /** Where the build goes: `<scratchDir>/client-dist`. */
  scratchDir: string;
  /** How long to wait for vite (or for another test file's build of the same folder). */
  timeoutMs?: number;
}

export interface BuiltClient {
  distDir: string;
  /** False when another test file had already built it in this run. */
  builtHere: boolean;
}

function checkBuildClientOnceOptions(options: BuildClientOnceOptions): Required<BuildClientOnceOptions> {
  if (typeof options.scratchDir !== 'string' || !path.isAbsolute(options.scratchDir)) {
    throw new TypeError(`buildClientOnce: option "scratchDir" must be an absolute path; got ${JSON.stringify(options.scratchDir)}.`);
  }
  const timeoutMs = options.timeoutMs ?? 180_000;
  if (!(Number.isFinite(timeoutMs) && timeoutMs > 0)) {
    throw new RangeError(`buildClientOnce: option "timeoutMs" must be a positive number of milliseconds; got ${timeoutMs}.`);
  }
  return { scratchDir: options.scratchDir, timeoutMs };
}

function runViteBuild(outDir: string, timeoutMs: number): Promise<void> {
  const viteBin = path.join(projectRoot, 'node_modules', 'vite', 'bin', 'vite.js');
  return new Promise((resolve, reject) => {
    // node + the script, not node_modules/.bin: the PID kept is vite itself.
    const child = spawn(process.execPath, [viteBin, 'build', '--outDir', outDir, '--emptyOutDir', '--logLevel', 'warn'], {
      cwd: projectRoot,
      env: { ...process.env, NODE_ENV: 'production' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.stderr.on('data', (chunk: Buffer) => (output += chunk.toString()));
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`vite build did not finish within ${timeoutMs} ms. Its output so far:\n${output}`));
    }, timeoutMs);
    child.on('error', (error) => {
      clearTimeout(timer);
      reject(new Error(`vite build could not start: ${error.message}`));
    });
    child.on('exit', (code, signal) => {
      clearTimeout(timer);
      if (code === 0) resolve();
      else reject(new Error(`vite build failed (${signal ?? `exit code ${code}`}):\n${output}`));
    });
  });
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Builds the client into `<scratchDir>/client-dist` unless this run already did; returns the folder. */
export async function buildClientOnce(options: BuildClientOnceOptions): Promise<BuiltClient> {
  const { scratchDir, timeoutMs } = checkBuildClientOnceOptions(options);
  const distDir = path.join(scratchDir, 'client-dist');
  const doneMarker = path.join(scratchDir, 'client-dist.built');
  const lockDir = path.join(scratchDir, 'client-dist.lock');
  await mkdir(scratchDir, { recursive: true });
  if (existsSync(doneMarker)) return { distDir, builtHere: false };

  let haveLock = false;
  try {
    // mkdir is atomic: exactly one test process builds, the others wait for its marker.
    await mkdir(lockDir);
    haveLock = true;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
  }
  if (!haveLock) {
    const deadline = Date.now() + timeoutMs;
    while (!existsSync(doneMarker)) {
      if (!existsSync(lockDir)) throw new Error(`Another test process stopped building the client into ${distDir} without finishing; see its error.`);
      if (Date.now() > deadline) throw new Error(`The client build into ${distDir} by another test process did not finish within ${timeoutMs} ms.`);
      await sleep(250);
    }
    return { distDir, builtHere: false };
  }
  try {
    await runViteBuild(distDir, timeoutMs);
    if (!existsSync(path.join(distDir, 'index.html'))) throw new Error(`vite build succeeded but wrote no index.html into ${distDir}.`);
    await writeFile(doneMarker, new Date().toISOString());
    return { distDir, builtHere: true };
  } finally {
    await rm(lockDir, { recursive: true, force: true });
  }
}
