import { asc, eq, inArray } from 'drizzle-orm';
import type { ReviewEntry } from '../../../shared/schemas/review';
import type { Database } from '../../db/client';
import { analysisRuns, measurements, people, personRoles, reviewEntries } from '../../db/schema';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';

/** A measurement's review thread, oldest first, with each author's roles. */
export async function listReviewEntries(db: Database, measurementId: string): Promise<ReviewEntry[]> {
  const [measurement] = await db.select({ id: measurements.id }).from(measurements).where(eq(measurements.id, measurementId));
  if (!measurement) throw new HttpError(HttpStatus.NOT_FOUND, `There is no measurement with id ${measurementId}.`);
  const rows = await db
    .select({ entry: reviewEntries, authorName: people.name, analysisVersion: analysisRuns.version })
    .from(reviewEntries)
    .leftJoin(people, eq(people.id, reviewEntries.authorId))
    .leftJoin(analysisRuns, eq(analysisRuns.id, reviewEntries.analysisRunId))
    .where(eq(reviewEntries.measurementId, measurementId))
    .orderBy(asc(reviewEntries.createdAt), asc(reviewEntries.id));
  const authorIds = [...new Set(rows.map((r) => r.entry.authorId).filter((id): id is string => Boolean(id)))];
  const roleRows = authorIds.length ? await db.select().from(personRoles).where(inArray(personRoles.personId, authorIds)) : [];
  const rolesOf = new Map<string, string[]>();
  for (const { personId, role } of roleRows) rolesOf.set(personId, [...(rolesOf.get(personId) ?? []), role].sort());
  return rows.map(({ entry, authorName, analysisVersion }) => ({
    id: entry.id,
    kind: entry.kind,
    body: entry.body,
    author: entry.authorId && authorName ? { id: entry.authorId, name: authorName, roles: rolesOf.get(entry.authorId) ?? [] } : null,
    analysisVersion: analysisVersion ?? null,
    createdAt: entry.createdAt.toISOString(),
  }));
}

/** Adds a plain comment to the thread, in any state (a certified measurement can still be discussed). */
export async function addReviewComment(db: Database, measurementId: string, actor: Actor, body: string): Promise<string> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .select({ id: measurements.id, number: measurements.number, currentAnalysisId: measurements.currentAnalysisId })
      .from(measurements)
      .where(eq(measurements.id, measurementId));
    if (!row) throw new HttpError(HttpStatus.NOT_FOUND, `There is no measurement with id ${measurementId}.`);
    const [created] = await tx
      .insert(reviewEntries)
      .values({ measurementId: row.id, authorId: actor.actorId, kind: 'comment', body, analysisRunId: row.currentAnalysisId })
      .returning({ id: reviewEntries.id });
    await recordAuditEvent(tx, {
      actorId: actor.actorId,
      action: 'measurement.commented',
      subjectType: 'measurement',
      subjectId: row.id,
      details: { number: row.number, reviewEntryId: created.id },
      ip: actor.ip ?? null,
    });
    return created.id;
  });
}
