import { eq } from 'drizzle-orm';
import { people } from '../../db/schema';
import type { Queryable } from '../numbering';

/** Stamps people.lastSignInAt after a successful sign-in. */
export async function recordSignIn(db: Queryable, personId: string, at: Date = new Date()): Promise<void> {
  await db.update(people).set({ lastSignInAt: at }).where(eq(people.id, personId));
}
