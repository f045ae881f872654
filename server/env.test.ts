import { describe, expect, it } from 'vitest';
import { InvalidEnvironmentError, numericSettings, parseEnv } from './env';

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

  it('fills the PARAXIA_* settings with their defaults when nothing is set', () => {
    const env = parseEnv({});
    expect(env).toMatchObject({
      PARAXIA_FRAME_MAX_BYTES: 80 * 1024 * 1024,
      PARAXIA_FRAME_MAX_PIXELS: 60_000_000,
      PARAXIA_ANALYSIS_QUEUE_NAME: 'analyse-measurement',
      PARAXIA_ANALYSIS_EXPIRE_SECONDS: 900,
      PARAXIA_ANALYSIS_RETRY_LIMIT: 2,
      PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: 15,
      PARAXIA_ANALYSIS_MAINTENANCE_SECONDS: 60,
      PARAXIA_ANALYSIS_POLLING_SECONDS: 2,
      PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: 20,
      PARAXIA_RETENTION_DAYS: 365,
      PARAXIA_ORPHAN_MIN_AGE_MINUTES: 60,
      PARAXIA_MAIL_POLLING_MS: 5000,
    });
    expect(env.PARAXIA_ANALYSIS_ENGINE_CONCURRENCY).toBeUndefined();
    expect(env.PARAXIA_ANALYSIS_SCRATCH_DIR).toBeUndefined();
  });

  it('reads the PARAXIA_* settings as numbers at the ends of their ranges, and a blank one as unset', () => {
    const env = parseEnv({
      PARAXIA_FRAME_MAX_BYTES: '1',
      PARAXIA_ANALYSIS_POLLING_SECONDS: '0.5',
      PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: '0',
      PARAXIA_ANALYSIS_ENGINE_CONCURRENCY: '64',
      PARAXIA_RETENTION_DAYS: '36500',
      PARAXIA_ORPHAN_MIN_AGE_MINUTES: '0',
      PARAXIA_MAIL_POLLING_MS: '  ',
      PARAXIA_ANALYSIS_SCRATCH_DIR: '/var/tmp/paraxia-analysis',
    });
    expect(env).toMatchObject({
      PARAXIA_FRAME_MAX_BYTES: 1,
      PARAXIA_ANALYSIS_POLLING_SECONDS: 0.5,
      PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: 0,
      PARAXIA_ANALYSIS_ENGINE_CONCURRENCY: 64,
      PARAXIA_RETENTION_DAYS: 36500,
      PARAXIA_ORPHAN_MIN_AGE_MINUTES: 0,
      PARAXIA_MAIL_POLLING_MS: 5000,
      PARAXIA_ANALYSIS_SCRATCH_DIR: '/var/tmp/paraxia-analysis',
    });
  });

  const badSettings: [name: string, value: string, sentence: string][] = [
    ['PARAXIA_FRAME_MAX_BYTES', '80MB', 'PARAXIA_FRAME_MAX_BYTES must be a whole number from 1 to 1073741824 (got "80MB").'],
    ['PARAXIA_FRAME_MAX_PIXELS', '0', 'PARAXIA_FRAME_MAX_PIXELS must be a whole number from 1 to 500000000 (got "0").'],
    [
      'PARAXIA_ANALYSIS_QUEUE_NAME',
      'Analyse Measurement',
      'PARAXIA_ANALYSIS_QUEUE_NAME must be 1 to 61 lower-case letters, digits or hyphens, starting with a letter or digit (got "Analyse Measurement").',
    ],
    ['PARAXIA_ANALYSIS_EXPIRE_SECONDS', 'soon', 'PARAXIA_ANALYSIS_EXPIRE_SECONDS must be a whole number from 1 to 82800 (got "soon").'],
    ['PARAXIA_ANALYSIS_RETRY_LIMIT', '2.5', 'PARAXIA_ANALYSIS_RETRY_LIMIT must be a whole number from 0 to 20 (got "2.5").'],
    ['PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS', '-1', 'PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS must be a whole number from 0 to 3600 (got "-1").'],
    ['PARAXIA_ANALYSIS_MAINTENANCE_SECONDS', '0', 'PARAXIA_ANALYSIS_MAINTENANCE_SECONDS must be a whole number from 1 to 3600 (got "0").'],
    // pg-boss polls no faster than every 0.5 s (its own configuration check).
    ['PARAXIA_ANALYSIS_POLLING_SECONDS', '0.1', 'PARAXIA_ANALYSIS_POLLING_SECONDS must be a number from 0.5 to 600 (got "0.1").'],
    ['PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS', 'off', 'PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS must be a whole number from 0 to 3600 (got "off").'],
    ['PARAXIA_ANALYSIS_ENGINE_CONCURRENCY', '65', 'PARAXIA_ANALYSIS_ENGINE_CONCURRENCY must be a whole number from 1 to 64 (got "65").'],
    ['PARAXIA_RETENTION_DAYS', '0', 'PARAXIA_RETENTION_DAYS must be a whole number from 1 to 36500 (got "0").'],
    ['PARAXIA_ORPHAN_MIN_AGE_MINUTES', '1h', 'PARAXIA_ORPHAN_MIN_AGE_MINUTES must be a whole number from 0 to 10080 (got "1h").'],
    ['PARAXIA_MAIL_POLLING_MS', 'Infinity', 'PARAXIA_MAIL_POLLING_MS must be a whole number from 100 to 3600000 (got "Infinity").'],
  ];

  it.each(badSettings)('refuses a bad %s (%s) with one sentence naming it', (name, value, sentence) => {
    let caught: unknown;
    try {
      parseEnv({ [name]: value });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(InvalidEnvironmentError);
    expect((caught as InvalidEnvironmentError).problems).toEqual([sentence]);
  });

  it('has a bad-value case above for every numeric PARAXIA_* setting', () => {
    const covered = new Set(badSettings.map(([name]) => name));
    expect(Object.keys(numericSettings).filter((name) => !covered.has(name))).toEqual([]);
  });
});

describe('PARAXIA_WORKER_SENDS_MAIL', () => {
  it('defaults to true, reads false, and names itself when it is neither', () => {
    expect(parseEnv({}).PARAXIA_WORKER_SENDS_MAIL).toBe(true);
    expect(parseEnv({ PARAXIA_WORKER_SENDS_MAIL: 'false' }).PARAXIA_WORKER_SENDS_MAIL).toBe(false);
    expect(() => parseEnv({ PARAXIA_WORKER_SENDS_MAIL: 'sometimes' })).toThrow(/PARAXIA_WORKER_SENDS_MAIL must be true or false/);
  });
});
