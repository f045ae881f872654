import { asc, eq } from 'drizzle-orm';
import { organisations } from '../../db/schema';
import type { Queryable } from '../numbering';

export const FALLBACK_LAB_NAME = 'your laboratory';

/** The lab's own name as mail and public pages show it (the first organisation of kind "lab"). */
export async function findLabName(db: Queryable): Promise<string> {
  const [lab] = await db
    .select({ name: organisations.name })
    .from(organisations)
    .where(eq(organisations.kind, 'lab'))
    .orderBy(asc(organisations.createdAt))
    .limit(1);
  return lab?.name ?? FALLBACK_LAB_NAME;
}
