import { describe, expect, it } from 'vitest';
import { InvalidEnvironmentError, parseEnv } from './env';

describe('parseEnv', () => {
  it('fills local defaults when nothing is set', () => {
    const env = parseEnv({});
    expect(env).toMatchObject({
      NODE_ENV: 'development',
      HOST: '127.0.0.1',
      PORT: 8080,
      DATABASE_URL: 'postgres://app@127.0.0.1:54329/paraxia',
      S3_ENDPOINT: 'http://127.0.0.1:9329',
      S3_BUCKET: 'paraxia',
      S3_FORCE_PATH_STYLE: true,
      SMTP_PORT: 2529,
      SMTP_IGNORE_TLS: true,
      PUBLIC_BASE_URL: 'http://localhost:8080',
      SIGN_IN_RATE_LIMIT_MAX: 10,
    });
    expect(env.SESSION_SECRET.length).toBeGreaterThanOrEqual(32);
  });

  it('treats an empty variable as unset', () => {
    expect(parseEnv({ PORT: '' }).PORT).toBe(8080);
  });

  it('lists every bad variable in one error, each named in a sentence', () => {
    let caught: unknown;
    try {
      parseEnv({ PORT: 'eighty', DATABASE_URL: 'mysql://x', S3_FORCE_PATH_STYLE: 'maybe', S3_BUCKET: 'A' });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(InvalidEnvironmentError);
    expect((caught as InvalidEnvironmentError).problems).toEqual([
      'PORT must be a whole number between 1 and 65535 (got "eighty").',
      'DATABASE_URL must be a URL starting with postgres:// or postgresql:// (got "mysql://x").',
      'S3_BUCKET must be 3 to 63 lower-case letters, digits, dots or hyphens, starting and ending with a letter or digit (got "A").',
      'S3_FORCE_PATH_STYLE must be true or false (also accepted: 1/0, yes/no, on/off) (got "maybe").',
    ]);
  });

  it('requires a long SESSION_SECRET in production and never prints secrets', () => {
    expect(() => parseEnv({ NODE_ENV: 'production' })).toThrow('SESSION_SECRET is required when NODE_ENV is production.');
    try {
      parseEnv({ NODE_ENV: 'production', SESSION_SECRET: 'short-secret' });
      expect.unreachable();
    } catch (error) {
      expect((error as InvalidEnvironmentError).problems).toEqual(['SESSION_SECRET must be at least 32 characters long in production.']);
      expect((error as Error).message).not.toContain('short-secret');
    }
    const production = parseEnv({ NODE_ENV: 'production', SESSION_SECRET: 'x'.repeat(40) });
    expect(production.HOST).toBe('0.0.0.0');
    expect(production.SMTP_IGNORE_TLS).toBe(false);
  });

  it('requires SMTP_USER and SMTP_PASS together', () => {
    expect(() => parseEnv({ SMTP_USER: 'relay' })).toThrow('SMTP_PASS must be set together with SMTP_USER (set both or neither).');
  });
});
