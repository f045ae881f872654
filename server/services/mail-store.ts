import { readFile } from 'node:fs/promises';
import path from 'node:path';

/** One message kept by the local fake SMTP server (scripts/services/mail-catcher.ts).
 * The folder holds `<id>.eml` per message and `index.json`, an array of these, oldest first. */
export interface StoredMailEntry {
  id: string;
  /** File name of the raw message, relative to the mail folder. */
  emlFile: string;
  receivedAt: string;
  envelopeFrom: string | null;
  envelopeTo: string[];
  from: string;
  to: string;
  subject: string;
  messageId: string | null;
  textPreview: string;
  sizeBytes: number;
  attachments: { filename: string | null; contentType: string; sizeBytes: number }[];
}

export const MAIL_INDEX_FILE = 'index.json';

/** Reads the index of kept messages; an absent folder or index means no mail yet. */
export async function readMailIndex(mailStoreDir: string): Promise<StoredMailEntry[]> {
  try {
    const text = await readFile(path.join(mailStoreDir, MAIL_INDEX_FILE), 'utf8');
    return JSON.parse(text) as StoredMailEntry[];
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw error;
  }
}

export async function readStoredMailSource(mailStoreDir: string, entry: StoredMailEntry): Promise<Buffer> {
  return readFile(path.join(mailStoreDir, path.basename(entry.emlFile)));
}
