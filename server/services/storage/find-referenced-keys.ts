import { inArray } from 'drizzle-orm';
import { certificates, frames } from '../../db/schema';
import type { Queryable } from '../numbering';

/**
 * Which of `keys` a database record points at: a frame's original, thumbnail
 * or preview, or a certificate's PDF. A purged frame still names its original,
 * so its key stays "referenced" even though the object is gone.
 */
export async function findReferencedKeys(db: Queryable, keys: readonly string[]): Promise<Set<string>> {
  if (keys.length === 0) return new Set();
  const list = [...keys];
  const [originals, thumbnails, previews, pdfs] = await Promise.all([
    db.select({ key: frames.objectKey }).from(frames).where(inArray(frames.objectKey, list)),
    db.select({ key: frames.thumbnailKey }).from(frames).where(inArray(frames.thumbnailKey, list)),
    db.select({ key: frames.previewKey }).from(frames).where(inArray(frames.previewKey, list)),
    db.select({ key: certificates.objectKey }).from(certificates).where(inArray(certificates.objectKey, list)),
  ]);
  const referenced = new Set<string>();
  for (const row of [...originals, ...thumbnails, ...previews, ...pdfs]) if (row.key) referenced.add(row.key);
  return referenced;
}
