import { parseEnv, type Env } from '../../server/env';

export const SERVICES_MISSING_MESSAGE =
  'This test needs PostgreSQL, fake S3 and fake SMTP: run it through `npm test` (e.g. `npm test -- tests/api`), which starts them and sets DATABASE_URL, S3_ENDPOINT, SMTP_PORT and MAIL_STORE_DIR.';

/** Throws a clear sentence when the services that `npm test` starts are absent. */
export function requireTestServices(): void {
  if (process.env.PARAXIA_TEST_SERVICES !== '1') throw new Error(SERVICES_MISSING_MESSAGE);
}

/** The environment `npm test` exported, with per-test overrides. */
export function testEnv(overrides: Record<string, string> = {}): Env {
  requireTestServices();
  return parseEnv({ ...process.env, ...overrides });
}
