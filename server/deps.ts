import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type pg from 'pg';
import { createDatabase, type Database } from './db/client';
import type { Env } from './env';
import { createLogger, type Logger } from './services/logger';
import { createMailer, type Mailer } from './services/mailer';
import { createObjectStorage, type ObjectStorage } from './services/object-storage';
import { createPasswordHasher, type PasswordHasher } from './services/passwords';

/** Everything createApp() needs from the outside world; tests build their own. */
export interface AppDeps {
  env: Env;
  log: Logger;
  pool: pg.Pool;
  db: Database;
  storage: ObjectStorage;
  mailer: Mailer;
  sessionStore: session.Store;
  passwords: PasswordHasher;
}

const PgSessionStore = connectPgSimple(session);

export function createDeps(env: Env, overrides: Partial<Omit<AppDeps, 'env'>> = {}): AppDeps {
  const log = overrides.log ?? createLogger({ level: env.LOG_LEVEL, name: 'web' });
  const { pool, db } = overrides.pool && overrides.db ? { pool: overrides.pool, db: overrides.db } : createDatabase({ databaseUrl: env.DATABASE_URL });
  return {
    env,
    log,
    pool,
    db,
    storage: overrides.storage ?? createObjectStorage(env),
    mailer: overrides.mailer ?? createMailer(env),
    sessionStore:
      overrides.sessionStore ??
      new PgSessionStore({
        pool,
        // Created by the Drizzle migrations (server/db/schema.ts, httpSessions).
        tableName: 'http_sessions',
        createTableIfMissing: false,
        pruneSessionInterval: 15 * 60,
        // Sessions are not rolling (the cookie's 12 h runs from sign-in), so refreshing the row's expiry on every request was a write per request for nothing.
        disableTouch: true,
        errorLog: (...args: unknown[]) => log.error('Session store error.', { detail: args.map(String).join(' ') }),
      }),
    passwords: overrides.passwords ?? createPasswordHasher({ rounds: env.PASSWORD_HASH_ROUNDS }),
  };
}

export async function closeDeps(deps: AppDeps): Promise<void> {
  const store = deps.sessionStore as session.Store & { close?: () => Promise<void> | void };
  await store.close?.();
  deps.mailer.close();
  deps.storage.close();
  await deps.pool.end();
}
