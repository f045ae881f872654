import type { StorageObjectKind } from '@shared/schemas/storage';

export const STORAGE_KIND_WORDS: Record<StorageObjectKind, string> = {
  'raw-frames': 'Raw frames',
  renditions: 'Thumbnails and previews',
  certificates: 'Certificates',
  other: 'Other',
};

/** Ink tones only: cobalt is kept for focus. Darkest for what retention can free. */
export const STORAGE_KIND_SWATCH: Record<StorageObjectKind, string> = {
  'raw-frames': 'bg-ink',
  renditions: 'bg-ink-faint',
  certificates: 'bg-rule-strong',
  other: 'bg-shade',
};
