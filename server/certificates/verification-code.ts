/**
 * Verification codes printed on certificates and the hash kept of each PDF.
 * The alphabet leaves out 0/O, 1/I/L so a code read aloud or typed from
 * paper cannot be mistaken.
 */
import { createHash, randomInt } from 'node:crypto';
import { InvalidOptionError } from '../../shared/measure/fit/invalid-option-error';

export const VERIFICATION_CODE_ALPHABET = '23456789ABCDEFGHJKMNPQRSTUVWXYZ';

/** Groups of alphabet characters joined by single hyphens, e.g. 7KQ4-MX2R-9TWH. */
export const verificationCodePattern = /^[23456789ABCDEFGHJKMNPQRSTUVWXYZ]+(-[23456789ABCDEFGHJKMNPQRSTUVWXYZ]+)*$/;

export interface MakeVerificationCodeOptions {
  /** Characters drawn from the alphabet, hyphens not counted (default 12: 31¹² ≈ 2⁵⁹ codes). */
  characterCount?: number;
  /** Characters per hyphen-separated group (default 4). */
  groupSize?: number;
}

export function checkMakeVerificationCodeOptions(options: MakeVerificationCodeOptions = {}): Required<MakeVerificationCodeOptions> {
  const { characterCount = 12, groupSize = 4 } = options;
  if (!Number.isInteger(characterCount) || characterCount < 8 || characterCount > 64) {
    throw new InvalidOptionError(`Option characterCount must be a whole number from 8 to 64 (got ${characterCount}).`);
  }
  if (!Number.isInteger(groupSize) || groupSize < 1 || groupSize > characterCount) {
    throw new InvalidOptionError(`Option groupSize must be a whole number from 1 to characterCount (got ${groupSize}).`);
  }
  return { characterCount, groupSize };
}

/** A fresh crypto-random code (node:crypto randomInt, uniform over the alphabet), e.g. 7KQ4-MX2R-9TWH. */
export function makeVerificationCode(options: MakeVerificationCodeOptions = {}): string {
  const { characterCount, groupSize } = checkMakeVerificationCodeOptions(options);
  const groups: string[] = [];
  let group = '';
  for (let i = 0; i < characterCount; i += 1) {
    group += VERIFICATION_CODE_ALPHABET[randomInt(VERIFICATION_CODE_ALPHABET.length)];
    if (group.length === groupSize) {
      groups.push(group);
      group = '';
    }
  }
  if (group) groups.push(group);
  return groups.join('-');
}

/**
 * A code as a person typed it, in the printed form: upper case, spaces and
 * hyphens dropped, then regrouped. Returns null when any character is outside
 * the alphabet (a typed 0, O, 1, I or L cannot belong to a real code).
 */
export function normaliseVerificationCode(typed: string, options: { groupSize?: number } = {}): string | null {
  const groupSize = options.groupSize ?? 4;
  if (!Number.isInteger(groupSize) || groupSize < 1) throw new InvalidOptionError(`Option groupSize must be a positive whole number (got ${groupSize}).`);
  const characters = typed.toUpperCase().replace(/[\s-]+/g, '');
  if (characters.length === 0 || ![...characters].every((c) => VERIFICATION_CODE_ALPHABET.includes(c))) return null;
  const groups: string[] = [];
  for (let i = 0; i < characters.length; i += groupSize) groups.push(characters.slice(i, i + groupSize));
  return groups.join('-');
}

/** Lower-case hex SHA-256 of a buffer (node:crypto). */
export function sha256Hex(buffer: Uint8Array): string {
  return createHash('sha256').update(buffer).digest('hex');
}
