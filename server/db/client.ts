import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema>;

export interface DatabaseConnection {
  pool: pg.Pool;
  db: Database;
}

/**
 * A database restart breaks pooled connections. node-postgres reports that as
 * an 'error' event on the pool (idle connections) or on the client itself (a
 * connection checked out between two statements); an unheard 'error' event
 * ends the process. Heard here in every process (web, worker, seed), the
 * query using the connection fails and the pool opens a new one when asked.
 */
function hearLostConnections(pool: pg.Pool, onLost: (error: Error) => void): void {
  pool.on('error', onLost);
  pool.on('connect', (client) => client.on('error', onLost));
}

export function createDatabase(options: {
  databaseUrl: string;
  maxConnections?: number;
  /** Told when a pooled connection is lost (the default says nothing; the web app logs it). */
  onConnectionLost?: (error: Error) => void;
}): DatabaseConnection {
  const pool = new pg.Pool({
    connectionString: options.databaseUrl,
    max: options.maxConnections ?? 10,
    connectionTimeoutMillis: 5_000,
  });
  hearLostConnections(pool, options.onConnectionLost ?? (() => undefined));
  return { pool, db: drizzle(pool, { schema }) };
}
