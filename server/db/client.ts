import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema>;

export interface DatabaseConnection {
  pool: pg.Pool;
  db: Database;
}

export function createDatabase(options: { databaseUrl: string; maxConnections?: number }): DatabaseConnection {
  const pool = new pg.Pool({
    connectionString: options.databaseUrl,
    max: options.maxConnections ?? 10,
    connectionTimeoutMillis: 5_000,
  });
  return { pool, db: drizzle(pool, { schema }) };
}
