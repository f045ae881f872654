import path from 'node:path';
import { z } from 'zod';
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

/** Reads Paraxia's settings from environment variables; empty strings count
 * as unset so that `FOO= npm start` falls back to the default. */
export function parseEnv(source: Record<string, string | undefined> = process.env): Env {
  const present = Object.fromEntries(Object.entries(source).filter(([, value]) => value !== undefined && value !== ''));
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
