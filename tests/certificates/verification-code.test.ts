import { describe, expect, it } from 'vitest';
import {
  VERIFICATION_CODE_ALPHABET,
  makeVerificationCode,
  normaliseVerificationCode,
  sha256Hex,
  verificationCodePattern,
} from '../../server/certificates/verification-code';

describe('makeVerificationCode', () => {
  it('makeVerificationCode gives 12 characters in three hyphenated groups of 4 by default', () => {
    for (let i = 0; i < 200; i += 1) {
      const code = makeVerificationCode();
      expect(code).toMatch(/^[^-]{4}-[^-]{4}-[^-]{4}$/);
      expect(code).toMatch(verificationCodePattern);
    }
  });

  it('makeVerificationCode never uses 0, O, 1, I or L', () => {
    expect(VERIFICATION_CODE_ALPHABET).toHaveLength(31);
    expect(VERIFICATION_CODE_ALPHABET).not.toMatch(/[0O1IL]/);
    const seen = new Set(Array.from({ length: 2000 }, () => makeVerificationCode()).join('').replace(/-/g, ''));
    for (const character of '0O1IL') expect(seen.has(character)).toBe(false);
  });

  it('makeVerificationCode draws every alphabet character about equally often', () => {
    // 31 characters × 24 000 draws: each count is binomial(24 000, 1/31), mean ≈ 774, sd ≈ 27.4;
    // ±6 sd bounds fail by chance far less than once in a million runs.
    const counts = new Map<string, number>();
    for (let i = 0; i < 2000; i += 1) {
      for (const character of makeVerificationCode().replace(/-/g, '')) counts.set(character, (counts.get(character) ?? 0) + 1);
    }
    expect(counts.size).toBe(31);
    const mean = 24000 / 31;
    const sd = Math.sqrt(24000 * (1 / 31) * (30 / 31));
    for (const count of counts.values()) expect(Math.abs(count - mean)).toBeLessThan(6 * sd);
  });

  it('makeVerificationCode does not repeat itself in 20 000 codes', () => {
    const codes = new Set(Array.from({ length: 20000 }, () => makeVerificationCode()));
    expect(codes.size).toBe(20000);
  });

  it('makeVerificationCode honours characterCount and groupSize, and names a bad option', () => {
    expect(makeVerificationCode({ characterCount: 10, groupSize: 5 })).toMatch(/^[^-]{5}-[^-]{5}$/);
    expect(makeVerificationCode({ characterCount: 9, groupSize: 4 })).toMatch(/^[^-]{4}-[^-]{4}-[^-]$/);
    expect(() => makeVerificationCode({ characterCount: 4 })).toThrow('Option characterCount must be a whole number from 8 to 64 (got 4).');
    expect(() => makeVerificationCode({ groupSize: 0 })).toThrow('Option groupSize must be a whole number from 1 to characterCount (got 0).');
  });
});

describe('normaliseVerificationCode', () => {
  it('normaliseVerificationCode turns what a person typed into the printed form', () => {
    expect(normaliseVerificationCode(' 7kq4 mx2r 9twh ')).toBe('7KQ4-MX2R-9TWH');
    expect(normaliseVerificationCode('7KQ4MX2R9TWH')).toBe('7KQ4-MX2R-9TWH');
    expect(normaliseVerificationCode('7KQ4--MX2R-9TWH')).toBe('7KQ4-MX2R-9TWH');
  });

  it('normaliseVerificationCode refuses characters outside the alphabet', () => {
    expect(normaliseVerificationCode('7KQ4-MX2R-9TW0')).toBeNull();
    expect(normaliseVerificationCode('7KQ4-MX2R-9TWL')).toBeNull();
    expect(normaliseVerificationCode('')).toBeNull();
    expect(normaliseVerificationCode('7KQ4/MX2R')).toBeNull();
  });
});

describe('sha256Hex', () => {
  it('sha256Hex reproduces the FIPS 180-2 test vectors', () => {
    // FIPS 180-2, Appendix B.1 ("abc") and B.2 (the 448-bit message).
    expect(sha256Hex(Buffer.from('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(sha256Hex(Buffer.from('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq'))).toBe(
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    );
    // The empty message, as widely published (from memory; equals `sha256sum` of an empty file).
    expect(sha256Hex(new Uint8Array())).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
  });
});
