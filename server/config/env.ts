import 'dotenv/config';
import path from 'node:path';
import { z } from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0', ''])
  .default('false')
  .transform((value) => value === 'true' || value === '1');

/** The secret used when none is set: fine on a laptop, public knowledge anywhere else. */
export const LOCAL_SESSION_SECRET = 'sheetsmith-local-session-secret';
// Secrets printed in this repository: never acceptable for a server others can reach.
const PUBLISHED_SECRETS = new Set([LOCAL_SESSION_SECRET, 'change-me-to-a-long-random-string']);

function isLoopbackHost(host: string): boolean {
  return host === 'localhost' || host === '::1' || /^127(\.\d{1,3}){3}$/.test(host);
}

// Parsed once at start-up: a bad value stops the app with a clear message.
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  APP_URL: z.string().url().optional(),
  SESSION_SECRET: z.string().min(16).default(LOCAL_SESSION_SECRET),
  /** Idle timeout: a session unused this long ends (renewed on every request). */
  SESSION_IDLE_SECONDS: z.coerce
    .number()
    .int()
    .min(60)
    .default(7 * 24 * 60 * 60),
  /** Absolute lifetime: a session ends this long after sign-in, however busy. */
  SESSION_ABSOLUTE_SECONDS: z.coerce
    .number()
    .int()
    .min(60)
    .default(30 * 24 * 60 * 60),
  /** The invented demo shop: auto = only on a laptop (loopback HOST and the local secret). */
  DEMO: z.enum(['auto', 'on', 'off']).default('auto'),
  COOKIE_SECURE: bool,
  DB_HOST: z.string().default('127.0.0.1'),
  DB_PORT: z.coerce.number().int().default(3307),
  DB_NAME: z
    .string()
    .regex(/^[A-Za-z0-9_]+$/)
    .default('sheetsmith'),
  DB_USER: z.string().default('sheetsmith'),
  DB_PASSWORD: z.string().default('sheetsmith-local-db'),
  DATA_DIR: z.string().default('.data'),
  LOGIN_MAX_FAILURES: z.coerce.number().int().min(1).default(5),
  LOGIN_BLOCK_SECONDS: z.coerce.number().int().min(1).default(900),
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).default(12),
  /** New accounts per client address per hour. */
  LIMIT_SIGNUPS_PER_HOUR: z.coerce.number().int().min(1).default(10),
  /** Password-reset e-mails per e-mail address per hour (five times as many per client address). */
  LIMIT_RESETS_PER_HOUR: z.coerce.number().int().min(1).default(3),
  /** Invite e-mails per account per hour (three times as many per team per day; 3 per recipient per day). */
  LIMIT_INVITES_PER_HOUR: z.coerce.number().int().min(1).default(20),
  /** Proof-page requests (pages, pictures, answers) per client address per hour. */
  LIMIT_PROOF_REQUESTS_PER_HOUR: z.coerce.number().int().min(1).default(300),
  SMTP_HOST: z.string().default(''),
  SMTP_PORT: z.coerce.number().int().default(587),
  SMTP_USER: z.string().default(''),
  SMTP_PASSWORD: z.string().default(''),
  SMTP_SECURE: bool,
  MAIL_FROM: z.string().default('Sheetsmith <no-reply@sheetsmith.local>'),
  /** pino levels; silent by default under NODE_ENV=test. */
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).optional(),
  /** Files no row refers to are removed once this old (an upload writes its files before its rows). */
  STORAGE_GRACE_HOURS: z.coerce.number().min(1).default(24),
  ART_MAX_BYTES: z.coerce
    .number()
    .int()
    .min(1024)
    .default(50 * 1024 * 1024),
  OUTLINE_MAX_PIXELS: z.coerce.number().int().min(16).default(50_000_000),
  OUTLINE_MAX_OUTPUT_PIXELS: z.coerce.number().int().min(16).default(40_000_000),
  OUTLINE_THREADS: z.coerce.number().int().min(0).max(16).default(0),
  /** Threads an arrange run uses on a worker (0: one per core but one, at most four). */
  ARRANGE_THREADS: z.coerce.number().int().min(0).max(16).default(0),
  /** The job queues' Redis (scripts start a private one on 127.0.0.1:6390 unless this points elsewhere). */
  REDIS_URL: z
    .string()
    .regex(/^rediss?:\/\//, 'REDIS_URL: give an address like redis://127.0.0.1:6390')
    .default('redis://127.0.0.1:6390'),
  /** Key prefix in Redis, so several deployments can share one (default: one per database, `sheetsmith-<DB_NAME>`). */
  QUEUE_PREFIX: z
    .string()
    .regex(/^[A-Za-z0-9_:-]+$/)
    .optional(),
  /** Run a job worker inside each app process (a laptop needs nothing else); off when workers run on their own. */
  WORKERS_EMBEDDED: z
    .enum(['true', 'false', '1', '0'])
    .default('true')
    .transform((v) => v === 'true' || v === '1'),
  /** Jobs one worker process runs at once. */
  WORKER_CONCURRENCY: z.coerce.number().int().min(1).max(32).default(1),
  /** A worker's lock on its job; a dead worker's job is taken up again after it runs out. */
  JOB_LOCK_SECONDS: z.coerce.number().min(1).default(30),
  /** How often workers look for jobs whose worker died. */
  JOB_STALLED_SECONDS: z.coerce.number().min(0.5).default(15),
  /** Times a job may lose its worker before it fails with a message. */
  JOB_MAX_STALLS: z.coerce.number().int().min(0).max(10).default(1),
  /** Where files live: `local` (DATA_DIR/storage) or `s3` (any S3-compatible service). */
  STORAGE_DRIVER: z.enum(['local', 's3']).default('local'),
  S3_ENDPOINT: z.string().default(''),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z
    .string()
    .regex(/^[a-z0-9][a-z0-9.-]{1,61}[a-z0-9]$/, 'S3_BUCKET: 3 to 63 lower-case letters, digits, dots or dashes')
    .optional(),
  S3_ACCESS_KEY_ID: z.string().default(''),
  S3_SECRET_ACCESS_KEY: z.string().default(''),
  /** Path-style addresses (http://host/bucket/key), which most self-hosted S3 services need. */
  S3_FORCE_PATH_STYLE: bool,
  /** A folder inside the bucket, so several deployments can share one. */
  S3_PREFIX: z.string().default(''),
  /** The payments service's secret key; empty: the local payments fake (no real money, laptops and tests). */
  STRIPE_SECRET_KEY: z.string().default(''),
  /** The secret its webhook notices are signed with (the fake signs with this too). */
  STRIPE_WEBHOOK_SECRET: z.string().default('whsec_sheetsmith_local_fake_payments'),
  /** Where the local payments fake listens when no secret key is set (started by the app on a laptop). */
  PAYMENTS_FAKE_URL: z.string().url().default('http://127.0.0.1:3012'),
  /** Days a proof link stays open. */
  PROOF_LINK_DAYS: z.coerce.number().int().min(1).max(90).default(14),
  /** An export running longer than this is stopped and ends failed. */
  EXPORT_TIMEOUT_SECONDS: z.coerce.number().int().min(5).default(900),
});

export type LogLevel = NonNullable<z.infer<typeof envSchema>['LOG_LEVEL']>;
export type Env = Omit<z.infer<typeof envSchema>, 'LOG_LEVEL' | 'QUEUE_PREFIX'> & {
  LOG_LEVEL: LogLevel;
  /** Jobs belong to one database: apps and workers of one deployment share this; others never see its jobs. */
  QUEUE_PREFIX: string;
  appUrl: string;
  dataDir: string;
  outboxDir: string;
  storageDir: string;
  /** Whether the demo shop is seeded and its accounts may sign in. */
  demoMode: boolean;
};

export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Bad configuration in .env or the environment:\n${lines.join('\n')}`);
  }
  const env = parsed.data;
  if (env.STORAGE_DRIVER === 's3' && !env.S3_BUCKET)
    throw new Error('Bad configuration in .env or the environment:\n  S3_BUCKET: STORAGE_DRIVER=s3 needs the bucket name');
  const loopback = isLoopbackHost(env.HOST);
  if (!loopback && PUBLISHED_SECRETS.has(env.SESSION_SECRET)) {
    throw new Error(
      `HOST is ${env.HOST}, which other machines can reach, but SESSION_SECRET is the published default: anyone could forge a session. ` +
        'Set SESSION_SECRET to a long random value (for example: openssl rand -hex 32) in .env or the environment.',
    );
  }
  // The demo accounts have a published password: never on a server others can reach.
  const demoMode = loopback && (env.DEMO === 'on' || (env.DEMO === 'auto' && env.SESSION_SECRET === LOCAL_SESSION_SECRET));
  const dataDir = path.resolve(env.DATA_DIR);
  return {
    ...env,
    LOG_LEVEL: env.LOG_LEVEL ?? (env.NODE_ENV === 'test' ? 'silent' : 'info'),
    QUEUE_PREFIX: env.QUEUE_PREFIX ?? `sheetsmith-${env.DB_NAME}`,
    appUrl: (env.APP_URL ?? `http://${env.HOST}:${env.PORT}`).replace(/\/$/, ''),
    dataDir,
    outboxDir: path.join(dataDir, 'outbox'),
    storageDir: path.join(dataDir, 'storage'),
    demoMode,
  };
}

function loadEnvOrExit(): Env {
  try {
    return loadEnv();
  } catch (error) {
    // The server and the scripts stop with the reason alone, not a stack trace; tests see the throw.
    if (process.env.NODE_ENV === 'test') throw error;
    console.error(`[sheetsmith] ${(error as Error).message}`);
    process.exit(1);
  }
}

export const env = loadEnvOrExit();
