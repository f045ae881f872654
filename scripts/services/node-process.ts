import { spawn, type ChildProcess } from 'node:child_process';
import { projectRoot } from './paths';

export interface RunningNodeProcess {
  name: string;
  pid: number;
  /** Resolves with the exit code (128 + n when killed by signal n). */
  exited: Promise<number>;
  stop(options?: { graceMs?: number }): Promise<number>;
}

const signalNumbers: Partial<Record<NodeJS.Signals, number>> = { SIGHUP: 1, SIGINT: 2, SIGKILL: 9, SIGTERM: 15 };

/** Starts a TypeScript entry point as `node --import tsx <entry>`; the PID
 * kept is the server's own (an npx wrapper would leave its child running). */
export function startNodeProcess(options: {
  name: string;
  entry: string;
  env: NodeJS.ProcessEnv;
  args?: string[];
}): RunningNodeProcess {
  const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', options.entry, ...(options.args ?? [])], {
    cwd: projectRoot,
    env: options.env,
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  if (child.pid === undefined) throw new Error(`Could not start ${options.name} (${options.entry}).`);
  const pid = child.pid;
  const exited = new Promise<number>((resolve) => {
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 128 + (signalNumbers[signal] ?? 0) : 1)));
    child.on('error', () => resolve(1));
  });
  let exitCode: number | undefined;
  void exited.then((code) => (exitCode = code));

  return {
    name: options.name,
    pid,
    exited,
    async stop(stopOptions = {}) {
      if (exitCode !== undefined) return exitCode;
      child.kill('SIGTERM');
      const graceMs = stopOptions.graceMs ?? 10_000;
      const timer = setTimeout(() => child.kill('SIGKILL'), graceMs);
      const code = await exited;
      clearTimeout(timer);
      return code;
    },
  };
}

/** Polls the web server's health endpoint until it answers at all (200 or 503). */
export async function waitForHttp(url: string, options: { timeoutMs: number; process?: RunningNodeProcess }): Promise<void> {
  const deadline = Date.now() + options.timeoutMs;
  let processExited = false;
  void options.process?.exited.then(() => (processExited = true));
  while (Date.now() < deadline) {
    if (processExited) throw new Error(`${options.process?.name ?? 'The process'} exited before it answered at ${url}.`);
    try {
      const response = await fetch(url, { signal: AbortSignal.timeout(2_000) });
      await response.body?.cancel();
      return;
    } catch {
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
  }
  throw new Error(`Nothing answered at ${url} within ${options.timeoutMs} ms.`);
}
