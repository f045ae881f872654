import path from 'node:path';
import { drizzle } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import pg from 'pg';
import { projectRoot } from '../project-root';

export const migrationsFolder = path.join(projectRoot, 'drizzle');

/** Applies the generated migrations in `drizzle/` that the database has not seen yet. */
export async function applyMigrations(options: { databaseUrl: string; folder?: string }): Promise<void> {
  const pool = new pg.Pool({ connectionString: options.databaseUrl, max: 1 });
  try {
    await migrate(drizzle(pool), { migrationsFolder: options.folder ?? migrationsFolder });
  } finally {
    await pool.end();
  }
}
