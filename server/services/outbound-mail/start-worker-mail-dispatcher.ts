import { createDatabase } from '../../db/client';
import type { Env } from '../../env';
import type { Logger } from '../logger';
import { createMailer } from '../mailer';
import { startMailDispatcher } from './start-mail-dispatcher';

/** The outbox dispatcher of a worker process, with its own small pool and SMTP transport. */
export function startWorkerMailDispatcher(env: Env, log: Logger, options: { intervalMs?: number } = {}): { stop(): Promise<void> } {
  const { pool, db } = createDatabase({ databaseUrl: env.DATABASE_URL, maxConnections: 2 });
  const mailer = createMailer(env);
  const intervalMs = options.intervalMs ?? env.PARAXIA_MAIL_POLLING_MS;
  const dispatcher = startMailDispatcher({ db, mailer, log }, { intervalMs });
  log.info('Mail dispatcher ready.', { intervalMs });
  return {
    async stop() {
      await dispatcher.stop();
      mailer.close();
      await pool.end();
    },
  };
}
