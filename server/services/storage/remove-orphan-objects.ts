import type { OrphanKeptReason, OrphanRemovalResult } from '../../../shared/schemas/storage';
import type { Database } from '../../db/client';
import { recordAuditEvent } from '../audit-log';
import type { Actor } from '../catalogue-queries';
import type { ObjectStorage, StoredObjectInfo } from '../object-storage';
import { isOldEnough } from './find-orphan-objects';
import { findReferencedKeys } from './find-referenced-keys';

const HEAD_CONCURRENCY = 8;

async function headAll(storage: ObjectStorage, keys: readonly string[]): Promise<Map<string, StoredObjectInfo | null>> {
  const found = new Map<string, StoredObjectInfo | null>();
  let next = 0;
  const lane = async () => {
    while (next < keys.length) {
      const key = keys[next++];
      found.set(key, await storage.headObject(key));
    }
  };
  await Promise.all(Array.from({ length: Math.min(HEAD_CONCURRENCY, keys.length) }, lane));
  return found;
}

/**
 * Removes the listed objects that are still orphans now: each key is looked
 * up again in storage (it must exist and be old enough) and then in the
 * database just before the delete, so a key that gained a record since the
 * list was made is kept. Frames and certificates write their objects before
 * their rows, and an object past the minimum age is no upload in flight.
 */
export async function removeOrphanObjects(
  deps: { db: Database; storage: ObjectStorage },
  request: { keys: readonly string[]; minimumAgeMinutes: number },
  actor: Actor,
): Promise<OrphanRemovalResult> {
  const now = new Date();
  const kept: { key: string; reason: OrphanKeptReason }[] = [];
  const stored = await headAll(deps.storage, request.keys);
  const present: StoredObjectInfo[] = [];
  for (const key of request.keys) {
    const info = stored.get(key) ?? null;
    if (!info) kept.push({ key, reason: 'missing' });
    else if (!isOldEnough(info.lastModified, request.minimumAgeMinutes, now)) kept.push({ key, reason: 'too-young' });
    else present.push(info);
  }

  const referenced = await findReferencedKeys(deps.db, present.map((info) => info.key));
  const toDelete = present.filter((info) => {
    if (!referenced.has(info.key)) return true;
    kept.push({ key: info.key, reason: 'has-record' });
    return false;
  });

  const outcome = toDelete.length === 0 ? { deleted: [], failed: [] } : await deps.storage.deleteObjects(toDelete.map((info) => info.key));
  for (const failure of outcome.failed) kept.push({ key: failure.key, reason: 'delete-failed' });
  const sizes = new Map(toDelete.map((info) => [info.key, info.sizeBytes]));
  const removed = outcome.deleted.map((key) => ({ key, sizeBytes: sizes.get(key) ?? 0 }));
  const removedBytes = removed.reduce((sum, item) => sum + item.sizeBytes, 0);

  if (removed.length > 0) {
    await recordAuditEvent(deps.db, {
      actorId: actor.actorId,
      ip: actor.ip ?? null,
      action: 'storage.orphans-removed',
      subjectType: 'storage',
      details: {
        removedCount: removed.length,
        removedBytes,
        keptCount: kept.length,
        keys: removed.map((item) => item.key),
      },
    });
  }
  return { removedCount: removed.length, removedBytes, removed, kept };
}
