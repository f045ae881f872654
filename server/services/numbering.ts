import { sql } from 'drizzle-orm';
import type { NodePgQueryResultHKT } from 'drizzle-orm/node-postgres';
import type { PgDatabase } from 'drizzle-orm/pg-core';
import type * as schema from '../db/schema';
import { invariant } from '../invariant';

/** The database or a transaction on it (Drizzle's transaction is a PgDatabase too). */
export type Queryable = PgDatabase<NodePgQueryResultHKT, typeof schema>;

export type NumberedRecordKind = 'work-order' | 'measurement' | 'certificate';

export const NUMBER_PREFIXES: Record<NumberedRecordKind, string> = {
  'work-order': 'WO',
  measurement: 'M',
  certificate: 'C',
};

/** `WO-2026-0001`; past 9999 the serial simply grows a digit. */
export function formatRecordNumber(kind: NumberedRecordKind, year: number, serial: number): string {
  return `${NUMBER_PREFIXES[kind]}-${year}-${String(serial).padStart(4, '0')}`;
}

/**
 * The next number of `kind` for `year`, from the `number_counters` row
 * bumped with one upsert. Call it inside the transaction that inserts the
 * numbered row: the counter row stays locked until that transaction ends, so
 * concurrent callers get consecutive numbers, and a rollback returns the
 * number (no gaps). Outside a transaction the number is taken at once.
 */
export async function allocateNumber(db: Queryable, kind: NumberedRecordKind, year: number): Promise<string> {
  invariant(kind in NUMBER_PREFIXES, `unknown numbered record kind "${kind}"`);
  invariant(Number.isInteger(year) && year >= 1900 && year <= 9999, `year ${year} is not a four-digit calendar year`);
  const result = await db.execute<{ last_value: number }>(sql`
    insert into number_counters (kind, year, last_value) values (${kind}, ${year}, 1)
    on conflict (kind, year) do update set last_value = number_counters.last_value + 1
    returning last_value`);
  const serial = Number(result.rows[0]?.last_value);
  invariant(Number.isInteger(serial) && serial >= 1, 'the number counter upsert returned no value');
  return formatRecordNumber(kind, year, serial);
}
