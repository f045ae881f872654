import { describe, expect, it } from 'vitest';
import { checkSignInFields } from '@/features/auth/components/sign-in-form';

describe('checkSignInFields', () => {
  it('checkSignInFields names each missing field in a sentence', () => {
    expect(checkSignInFields('', '')).toEqual({ email: 'Enter your e-mail address.', password: 'Enter your password.' });
  });

  it('checkSignInFields rejects an address without @ and accepts a plain one', () => {
    expect(checkSignInFields('tech.larkspur-lab.example', 'x').email).toBe('Enter an e-mail address like name@lab.example.');
    expect(checkSignInFields('  tech@larkspur-lab.example ', 'x')).toEqual({});
  });
});
