import { spawn, type SpawnOptions } from 'node:child_process';

export interface CommandResult {
  exitCode: number;
  stdout: string;
  stderr: string;
}

/** Runs a command to completion and collects its output. Resolves on exit
 * (not on stream close): pg_ctl leaves a daemon that may inherit its pipes. */
export function runCommand(command: string, args: string[], options: SpawnOptions = {}): Promise<CommandResult> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: ['ignore', 'pipe', 'pipe'], ...options });
    let stdout = '';
    let stderr = '';
    child.stdout?.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
    child.stderr?.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
    child.on('error', reject);
    let settled = false;
    const finish = (code: number | null, signal: NodeJS.Signals | null) => {
      if (settled) return;
      settled = true;
      child.stdout?.destroy();
      child.stderr?.destroy();
      resolve({ exitCode: code ?? (signal ? 128 : 1), stdout, stderr });
    };
    child.on('close', finish);
    child.on('exit', (code, signal) => {
      // Give the pipes a moment to drain, then stop waiting for a daemon that holds them.
      setTimeout(() => finish(code, signal), 250).unref();
    });
  });
}
