import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';

export interface HealthCheckResult {
  ok: boolean;
  latencyMs: number;
  message?: string;
}

export interface HealthReport {
  status: 'ok' | 'degraded';
  checks: { database: HealthCheckResult; objectStorage: HealthCheckResult; mail: HealthCheckResult };
}

export const HEALTH_CHECK_TIMEOUT_MS = 3_000;

async function runCheck(
  deps: Pick<AppDeps, 'log'>,
  name: string,
  failureMessage: string,
  check: () => Promise<unknown>,
): Promise<HealthCheckResult> {
  const started = performance.now();
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      check(),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error(`timed out after ${HEALTH_CHECK_TIMEOUT_MS} ms`)), HEALTH_CHECK_TIMEOUT_MS);
      }),
    ]);
    return { ok: true, latencyMs: Math.round(performance.now() - started) };
  } catch (error) {
    deps.log.warn(`Health check "${name}" failed.`, { error });
    return { ok: false, latencyMs: Math.round(performance.now() - started), message: failureMessage };
  } finally {
    clearTimeout(timer);
  }
}

export async function checkHealth(deps: Pick<AppDeps, 'log' | 'pool' | 'storage' | 'mailer'>): Promise<HealthReport> {
  const [database, objectStorage, mail] = await Promise.all([
    runCheck(deps, 'database', 'The database did not answer a query.', () => deps.pool.query('select 1')),
    runCheck(deps, 'objectStorage', 'The object storage bucket could not be reached.', () => deps.storage.checkBucket()),
    runCheck(deps, 'mail', 'The SMTP server could not be reached.', () => deps.mailer.verify({ timeoutMs: HEALTH_CHECK_TIMEOUT_MS })),
  ]);
  const allOk = database.ok && objectStorage.ok && mail.ok;
  return { status: allOk ? 'ok' : 'degraded', checks: { database, objectStorage, mail } };
}

export function getHealth(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const report = await checkHealth(deps);
    res.setHeader('Cache-Control', 'no-store');
    res.status(report.status === 'ok' ? HttpStatus.OK : HttpStatus.SERVICE_UNAVAILABLE).json(report);
  };
}
