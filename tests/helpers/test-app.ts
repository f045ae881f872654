import type { Express } from 'express';
import { createApp } from '../../server/app';
import { closeDeps, createDeps, type AppDeps } from '../../server/deps';
import { testEnv } from '../setup/test-services';

export interface TestApp {
  app: Express;
  deps: AppDeps;
  close(): Promise<void>;
}

/** createApp() wired to the real PostgreSQL, S3 and SMTP that `npm test` started.
 * Each test file makes its own (its own pool and rate-limit memory). */
export function createTestApp(options: { env?: Record<string, string>; deps?: Partial<Omit<AppDeps, 'env'>> } = {}): TestApp {
  const env = testEnv(options.env);
  const deps = createDeps(env, options.deps);
  return { app: createApp(deps), deps, close: () => closeDeps(deps) };
}
