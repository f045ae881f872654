import { describe, expect, it } from 'vitest';
import { checkNewPassword } from '@/features/invitations/components/choose-password-form';

describe('checkNewPassword', () => {
  it('asks for 12 characters that are not all spaces, and the same password twice', () => {
    expect(checkNewPassword('short', 'short').password).toMatch(/^Use at least 12 characters/);
    expect(checkNewPassword('            ', '            ').password).toMatch(/^Use at least 12 characters/);
    expect(checkNewPassword('long enough words', 'long enough word').repeated).toBe('The two passwords differ; type the same one twice.');
    expect(checkNewPassword('long enough words', 'long enough words')).toEqual({});
  });
});
