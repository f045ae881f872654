import { createHash, randomBytes } from 'node:crypto';

export interface LinkToken {
  /** Goes into the e-mailed link and nowhere else. */
  token: string;
  /** What the database keeps: a leaked table row cannot be turned back into a working link. */
  tokenHash: string;
}

/** A one-time link token: 32 random bytes, base64url (43 characters). */
export function createLinkToken(): LinkToken {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashLinkToken(token) };
}

export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}
