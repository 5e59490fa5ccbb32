import { z } from 'zod';

// Configuration is parsed once, here; the process refuses to start on bad values.
const booleanish = z.enum(['true', 'false', '1', '0']).transform((v) => v === 'true' || v === '1');

const configSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  PUBLIC_URL: z.url().optional(),
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'must be a postgres:// URL'),
  SESSION_SECRET: z.string().min(16).default('crosswatt-development-secret-change-me'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  RUN_WORKER: booleanish.default(true),

  OAUTH_CLIENT_ID: z.string().default('crosswatt-local'),
  OAUTH_CLIENT_SECRET: z.string().default('crosswatt-local-secret'),
  OAUTH_AUTHORIZE_URL: z.url().optional(),
  OAUTH_TOKEN_URL: z.url().optional(),
  OAUTH_PROFILE_URL: z.url().optional(),
  OAUTH_EMAILS_URL: z.url().optional(),
  OAUTH_FAKE: booleanish.default(false),

  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  SMTP_FROM: z.string().default('Crosswatt <no-reply@crosswatt.test>'),
  SMTP_SECURE: booleanish.default(false),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),

  RATE_LIMIT_WINDOW_MS: z.coerce.number().int().positive().default(60_000),
  RATE_LIMIT_WRITES_PER_WINDOW: z.coerce.number().int().positive().default(60),
  RATE_LIMIT_WRITES_PER_ADDRESS_PER_WINDOW: z.coerce.number().int().positive().default(300),
  RATE_LIMIT_SIGNINS_PER_WINDOW: z.coerce.number().int().positive().default(30),
  /** Thread posts (new threads, replies, edits) per person in ten minutes. */
  RATE_LIMIT_POSTS_PER_TEN_MINUTES: z.coerce.number().int().positive().default(10),
  SUBMISSIONS_PER_DAY: z.coerce.number().int().positive().default(20),

  // Object storage for the uploaded files (location removed), through the S3 API:
  // any S3-compatible store; npm start and the tests point these at a fake on loopback.
  /** The store's URL; unset means the S3 service of S3_REGION. */
  S3_ENDPOINT: z.url().optional(),
  S3_BUCKET: z
    .string()
    .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, 'must be an S3 bucket name (3–63 of a–z, 0–9, . and -)')
    .default('crosswatt-originals'),
  S3_REGION: z.string().min(1).default('us-east-1'),
  /** Both or neither: without them the SDK's own credential chain is used (instance roles and the like). */
  S3_ACCESS_KEY_ID: z.string().min(1).optional(),
  S3_SECRET_ACCESS_KEY: z.string().min(1).optional(),
  /** Bucket in the path rather than the host name, as most self-hosted stores want. */
  S3_FORCE_PATH_STYLE: booleanish.default(false),
  /** Objects no recording refers to are removed once they are this old (an upload in flight writes before it commits). */
  ORIGINALS_SWEEP_GRACE_HOURS: z.coerce.number().positive().default(24),
  /** Mail retries: the first after this long, each later one twice as long, capped; given up after MAIL_GIVE_UP_AFTER_SECONDS. */
  MAIL_RETRY_FIRST_DELAY_SECONDS: z.coerce.number().int().positive().default(30),
  MAIL_RETRY_MAX_DELAY_SECONDS: z.coerce.number().int().positive().default(3600),
  /** Two days: an outage of a day or more still ends in delivery. */
  MAIL_GIVE_UP_AFTER_SECONDS: z.coerce.number().int().positive().default(172_800),
  /** How often every worker looks for mail that is due and has no job (retries, mail stored while no worker ran). */
  MAIL_SWEEP_SECONDS: z.coerce.number().int().positive().default(30),
  /** An analysis job still active after this long (its worker died) is failed by pg-boss and retried. */
  ANALYSIS_JOB_EXPIRE_SECONDS: z.coerce.number().int().min(1).default(90),
  /** How often pg-boss expires stuck jobs (and does its other upkeep). */
  JOB_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).default(30),
});

export type Config = z.infer<typeof configSchema>;

export class ConfigError extends Error {}

export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const parsed = configSchema.safeParse(env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new ConfigError(`Invalid configuration: ${problems}`);
  }
  if (parsed.data.NODE_ENV === 'production' && parsed.data.SESSION_SECRET.startsWith('crosswatt-development')) {
    throw new ConfigError('Invalid configuration: SESSION_SECRET must be set in production');
  }
  if (parsed.data.NODE_ENV === 'production' && parsed.data.OAUTH_FAKE) {
    throw new ConfigError('Invalid configuration: OAUTH_FAKE (the local stand-in sign-in service) cannot be used in production');
  }
  if (Boolean(parsed.data.S3_ACCESS_KEY_ID) !== Boolean(parsed.data.S3_SECRET_ACCESS_KEY)) {
    throw new ConfigError('Invalid configuration: set both S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY, or neither');
  }
  return parsed.data;
}

export function publicUrl(config: Config): string {
  return config.PUBLIC_URL ?? `http://${config.HOST}:${config.PORT}`;
}
