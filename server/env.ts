import path from 'node:path';
import { z } from 'zod';
import { FRAME_MAX_BYTES, FRAME_MAX_PIXELS } from '../shared/schemas/frames';
import { RETENTION_DAYS_MAX, RETENTION_DAYS_MIN } from '../shared/schemas/storage';
import { projectRoot } from './project-root';

const booleanText = z.stringbool({
  error: 'must be true or false (also accepted: 1/0, yes/no, on/off).',
});

const portNumber = z.coerce
  .number({ error: 'must be a whole number between 1 and 65535.' })
  .int({ error: 'must be a whole number between 1 and 65535.' })
  .min(1, { error: 'must be a whole number between 1 and 65535.' })
  .max(65535, { error: 'must be a whole number between 1 and 65535.' });

function positiveInteger(description: string) {
  return z.coerce
    .number({ error: `must be ${description}.` })
    .int({ error: `must be ${description}.` })
    .positive({ error: `must be ${description}.` });
}

function urlWithProtocols(protocols: string[]) {
  const list = protocols.map((p) => `${p}//`).join(' or ');
  return z.string().refine(
    (value) => {
      try {
        return protocols.includes(new URL(value).protocol);
      } catch {
        return false;
      }
    },
    { error: `must be a URL starting with ${list}.` },
  );
}

export interface NumericSettingRange {
  min: number;
  max: number;
  integer: boolean;
}

/**
 * The numeric PARAXIA_* settings: range and default. The services check
 * options given in code (tests, scripts) against the same ranges.
 */
export const numericSettings = {
  PARAXIA_FRAME_MAX_BYTES: { min: 1, max: 1024 * 1024 * 1024, integer: true, default: FRAME_MAX_BYTES },
  PARAXIA_FRAME_MAX_PIXELS: { min: 1, max: 500_000_000, integer: true, default: FRAME_MAX_PIXELS },
  PARAXIA_ANALYSIS_EXPIRE_SECONDS: { min: 1, max: 23 * 3600, integer: true, default: 15 * 60 },
  PARAXIA_ANALYSIS_RETRY_LIMIT: { min: 0, max: 20, integer: true, default: 2 },
  PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: { min: 0, max: 3600, integer: true, default: 15 },
  PARAXIA_ANALYSIS_MAINTENANCE_SECONDS: { min: 1, max: 3600, integer: true, default: 60 },
  // pg-boss polls no faster than every 0.5 s (its own configuration check).
  PARAXIA_ANALYSIS_POLLING_SECONDS: { min: 0.5, max: 600, integer: false, default: 2 },
  PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: { min: 0, max: 3600, integer: true, default: 20 },
  PARAXIA_RETENTION_DAYS: { min: RETENTION_DAYS_MIN, max: RETENTION_DAYS_MAX, integer: true, default: 365 },
  PARAXIA_ORPHAN_MIN_AGE_MINUTES: { min: 0, max: 7 * 24 * 60, integer: true, default: 60 },
  PARAXIA_MAIL_POLLING_MS: { min: 100, max: 3_600_000, integer: true, default: 5_000 },
} as const satisfies Record<string, NumericSettingRange & { default: number }>;

/** Frames the engine decodes at once; unset leaves the engine's own choice. */
export const ENGINE_CONCURRENCY_RANGE: NumericSettingRange = { min: 1, max: 64, integer: true };

export const analysisQueueNameRule = {
  pattern: /^[a-z0-9][a-z0-9-]{0,60}$/,
  sentence: 'must be 1 to 61 lower-case letters, digits or hyphens, starting with a letter or digit',
  default: 'analyse-measurement',
} as const;

function numberInRange(range: NumericSettingRange) {
  const error = `must be ${range.integer ? 'a whole number' : 'a number'} from ${range.min} to ${range.max}.`;
  const bounded = z.coerce.number({ error }).min(range.min, { error }).max(range.max, { error });
  return range.integer ? bounded.int({ error }) : bounded;
}

function numericSetting(name: keyof typeof numericSettings) {
  return numberInRange(numericSettings[name]).default(numericSettings[name].default);
}

const SECRET_VARIABLES = new Set(['SESSION_SECRET', 'SMTP_PASS', 'S3_SECRET_ACCESS_KEY']);

const DEV_SESSION_SECRET = 'paraxia-local-development-session-secret-do-not-use-in-production';

const envSchema = z
  .object({
    NODE_ENV: z.enum(['development', 'test', 'production'], { error: 'must be development, test or production.' }).default('development'),
    HOST: z.string().min(1, { error: 'must not be empty.' }).optional(),
    PORT: portNumber.default(8080),
    PUBLIC_BASE_URL: urlWithProtocols(['http:', 'https:']).optional(),
    LOG_LEVEL: z.enum(['debug', 'info', 'warn', 'error', 'silent'], { error: 'must be debug, info, warn, error or silent.' }).default('info'),
    TRUST_PROXY: z.string().default('loopback'),
    CLIENT_DIST_DIR: z.string().default(path.join(projectRoot, 'dist')),

    DATABASE_URL: urlWithProtocols(['postgres:', 'postgresql:']).default('postgres://app@127.0.0.1:54329/paraxia'),

    SESSION_SECRET: z.string().optional(),
    PASSWORD_HASH_ROUNDS: z.coerce
      .number({ error: 'must be a whole number from 4 to 15.' })
      .int({ error: 'must be a whole number from 4 to 15.' })
      .min(4, { error: 'must be a whole number from 4 to 15.' })
      .max(15, { error: 'must be a whole number from 4 to 15.' })
      .default(12),
    SIGN_IN_RATE_LIMIT_MAX: positiveInteger('a whole number of failed sign-in attempts above 0').default(10),
    SIGN_IN_RATE_LIMIT_WINDOW_MS: positiveInteger('a whole number of milliseconds above 0').default(15 * 60 * 1000),
    INVITATION_EXPIRY_HOURS: positiveInteger('a whole number of hours above 0').default(7 * 24),
    PASSWORD_RESET_EXPIRY_MINUTES: positiveInteger('a whole number of minutes above 0').default(60),
    PASSWORD_RESET_RATE_LIMIT_MAX: positiveInteger('a whole number of reset requests above 0').default(5),

    S3_ENDPOINT: urlWithProtocols(['http:', 'https:']).optional(),
    S3_REGION: z.string().min(1, { error: 'must not be empty.' }).default('us-east-1'),
    S3_BUCKET: z
      .string()
      .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, {
        error: 'must be 3 to 63 lower-case letters, digits, dots or hyphens, starting and ending with a letter or digit.',
      })
      .default('paraxia'),
    S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
    S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
    S3_FORCE_PATH_STYLE: booleanText.default(true),

    SMTP_HOST: z.string().min(1, { error: 'must not be empty.' }).default('127.0.0.1'),
    SMTP_PORT: portNumber.default(2529),
    SMTP_SECURE: booleanText.default(false),
    SMTP_IGNORE_TLS: booleanText.optional(),
    SMTP_USER: z.string().optional(),
    SMTP_PASS: z.string().optional(),
    MAIL_FROM: z.string().min(3, { error: 'must be a sender such as "Paraxia <no-reply@lab.example>".' }).default('Paraxia <no-reply@paraxia.example>'),
    MAIL_STORE_DIR: z.string().default(path.join(projectRoot, '.data', 'mail')),
    PARAXIA_MAIL_POLLING_MS: numericSetting('PARAXIA_MAIL_POLLING_MS'),
    /** Whether an analysis worker process also sends the outbox (false for a worker that must only analyse). */
    PARAXIA_WORKER_SENDS_MAIL: booleanText.default(true),

    PARAXIA_FRAME_MAX_BYTES: numericSetting('PARAXIA_FRAME_MAX_BYTES'),
    PARAXIA_FRAME_MAX_PIXELS: numericSetting('PARAXIA_FRAME_MAX_PIXELS'),
    PARAXIA_RETENTION_DAYS: numericSetting('PARAXIA_RETENTION_DAYS'),
    PARAXIA_ORPHAN_MIN_AGE_MINUTES: numericSetting('PARAXIA_ORPHAN_MIN_AGE_MINUTES'),

    PARAXIA_ANALYSIS_QUEUE_NAME: z
      .string()
      .regex(analysisQueueNameRule.pattern, { error: `${analysisQueueNameRule.sentence}.` })
      .default(analysisQueueNameRule.default),
    PARAXIA_ANALYSIS_EXPIRE_SECONDS: numericSetting('PARAXIA_ANALYSIS_EXPIRE_SECONDS'),
    PARAXIA_ANALYSIS_RETRY_LIMIT: numericSetting('PARAXIA_ANALYSIS_RETRY_LIMIT'),
    PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS: numericSetting('PARAXIA_ANALYSIS_RETRY_DELAY_SECONDS'),
    PARAXIA_ANALYSIS_MAINTENANCE_SECONDS: numericSetting('PARAXIA_ANALYSIS_MAINTENANCE_SECONDS'),
    PARAXIA_ANALYSIS_POLLING_SECONDS: numericSetting('PARAXIA_ANALYSIS_POLLING_SECONDS'),
    PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS: numericSetting('PARAXIA_ANALYSIS_ORPHAN_CHECK_SECONDS'),
    PARAXIA_ANALYSIS_ENGINE_CONCURRENCY: numberInRange(ENGINE_CONCURRENCY_RANGE).optional(),
    /** Each analysis job makes its own folder inside this one; default: the system's temporary folder. */
    PARAXIA_ANALYSIS_SCRATCH_DIR: z.string().optional(),
  })
  .superRefine((env, ctx) => {
    if (env.NODE_ENV === 'production') {
      if (!env.SESSION_SECRET) {
        ctx.addIssue({ code: 'custom', path: ['SESSION_SECRET'], message: 'is required when NODE_ENV is production.' });
      } else if (env.SESSION_SECRET.length < 32) {
        ctx.addIssue({ code: 'custom', path: ['SESSION_SECRET'], message: 'must be at least 32 characters long in production.' });
      }
    }
    if ((env.SMTP_USER === undefined) !== (env.SMTP_PASS === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['SMTP_PASS'], message: 'must be set together with SMTP_USER (set both or neither).' });
    }
  })
  .transform((env) => {
    const isProduction = env.NODE_ENV === 'production';
    return {
      ...env,
      HOST: env.HOST ?? (isProduction ? '0.0.0.0' : '127.0.0.1'),
      PUBLIC_BASE_URL: (env.PUBLIC_BASE_URL ?? `http://localhost:${env.PORT}`).replace(/\/$/, ''),
      SESSION_SECRET: env.SESSION_SECRET ?? DEV_SESSION_SECRET,
      S3_ENDPOINT: env.S3_ENDPOINT ?? 'http://127.0.0.1:9329',
      SMTP_IGNORE_TLS: env.SMTP_IGNORE_TLS ?? !isProduction,
    };
  });

export type Env = z.output<typeof envSchema>;

/** Thrown by parseEnv; `problems` holds one sentence per bad variable. */
export class InvalidEnvironmentError extends Error {
  constructor(readonly problems: string[]) {
    super(`The environment has ${problems.length} invalid variable(s):\n${problems.map((p) => `  - ${p}`).join('\n')}`);
    this.name = 'InvalidEnvironmentError';
  }
}

/** Reads Paraxia's settings from environment variables; empty (or blank)
 * strings count as unset so that `FOO= npm start` falls back to the default. */
export function parseEnv(source: Record<string, string | undefined> = process.env): Env {
  const present = Object.fromEntries(Object.entries(source).filter(([, value]) => value !== undefined && value.trim() !== ''));
  const result = envSchema.safeParse(present);
  if (result.success) return result.data;
  const problems = result.error.issues.map((issue) => {
    const name = issue.path.join('.') || '(environment)';
    const shown = present[name] !== undefined && !SECRET_VARIABLES.has(name);
    const received = shown ? ` (got ${JSON.stringify(present[name])})` : '';
    const sentence = issue.message.replace(/\.$/, '');
    return `${name} ${sentence}${received}.`;
  });
  throw new InvalidEnvironmentError(problems);
}

/** For entry points: prints every bad variable and exits with status 1. */
export function loadEnvOrExit(source: Record<string, string | undefined> = process.env): Env {
  try {
    return parseEnv(source);
  } catch (error) {
    if (error instanceof InvalidEnvironmentError) {
      console.error(error.message);
      process.exit(1);
    }
    throw error;
  }
}
