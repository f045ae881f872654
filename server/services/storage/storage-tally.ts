import { storageObjectKinds, type StorageBreakdown, type StorageObjectKind } from '../../../shared/schemas/storage';

export function emptyBreakdown(): StorageBreakdown {
  const byKind = Object.fromEntries(storageObjectKinds.map((kind) => [kind, { objectCount: 0, bytes: 0 }])) as StorageBreakdown['byKind'];
  return { objectCount: 0, bytes: 0, byKind };
}

/** Adds one object of `sizeBytes` and `kind` to a breakdown, in place. */
export function addToBreakdown(breakdown: StorageBreakdown, kind: StorageObjectKind, sizeBytes: number): void {
  breakdown.objectCount += 1;
  breakdown.bytes += sizeBytes;
  breakdown.byKind[kind].objectCount += 1;
  breakdown.byKind[kind].bytes += sizeBytes;
}

/** Largest first; equal sizes in a stable order by id. */
export function byBytesDescending<T extends { bytes: number }>(id: (item: T) => string) {
  return (a: T, b: T) => b.bytes - a.bytes || id(a).localeCompare(id(b));
}
