import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import type { ServiceLog } from './console-log';
import { projectRoot } from './paths';

export interface ClientBuild {
  /** Resolves true when `vite build` succeeded, false when it failed or was skipped. */
  done: Promise<boolean>;
  cancel(): void;
}

/** Runs `vite build` into dist/. A failed build is reported but does not stop
 * the server: the previous dist/ (if any) keeps being served. */
export function buildClient(log: ServiceLog): ClientBuild {
  const viteBin = path.join(projectRoot, 'node_modules', '.bin', 'vite');
  if (!existsSync(path.join(projectRoot, 'index.html'))) {
    log.warn('No index.html at the project root yet; skipping the client build.');
    return { done: Promise.resolve(false), cancel: () => undefined };
  }
  log.step('Building the client (vite build)');
  const child: ChildProcess = spawn(viteBin, ['build'], { cwd: projectRoot, stdio: ['ignore', 'inherit', 'inherit'] });
  const done = new Promise<boolean>((resolve) => {
    child.on('exit', (code) => {
      if (code !== 0) log.warn(`The client build failed (exit ${code}); serving the previous build in dist/ if there is one.`);
      resolve(code === 0);
    });
    child.on('error', (error) => {
      log.warn(`The client build could not run: ${error.message}`);
      resolve(false);
    });
  });
  return { done, cancel: () => child.kill('SIGTERM') };
}
