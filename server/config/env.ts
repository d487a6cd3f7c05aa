import 'dotenv/config';
import path from 'node:path';
import { z } from 'zod';

const bool = z
  .enum(['true', 'false', '1', '0', ''])
  .default('false')
  .transform((value) => value === 'true' || value === '1');

// Parsed once at start-up: a bad value stops the app with a clear message.
const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('127.0.0.1'),
  APP_URL: z.string().url().optional(),
  SESSION_SECRET: z.string().min(16).default('sheetsmith-local-session-secret'),
  COOKIE_SECURE: bool,
  DB_HOST: z.string().default('127.0.0.1'),
  DB_PORT: z.coerce.number().int().default(3307),
  DB_NAME: z.string().regex(/^[A-Za-z0-9_]+$/).default('sheetsmith'),
  DB_USER: z.string().default('sheetsmith'),
  DB_PASSWORD: z.string().default('sheetsmith-local-db'),
  DATA_DIR: z.string().default('.data'),
  LOGIN_MAX_FAILURES: z.coerce.number().int().min(1).default(5),
  LOGIN_BLOCK_SECONDS: z.coerce.number().int().min(1).default(900),
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).default(12),
  SMTP_HOST: z.string().default(''),
  SMTP_PORT: z.coerce.number().int().default(587),
  SMTP_USER: z.string().default(''),
  SMTP_PASSWORD: z.string().default(''),
  SMTP_SECURE: bool,
  MAIL_FROM: z.string().default('Sheetsmith <no-reply@sheetsmith.local>'),
  ART_MAX_BYTES: z.coerce.number().int().min(1024).default(50 * 1024 * 1024),
  OUTLINE_MAX_PIXELS: z.coerce.number().int().min(16).default(50_000_000),
  OUTLINE_MAX_OUTPUT_PIXELS: z.coerce.number().int().min(16).default(40_000_000),
  OUTLINE_THREADS: z.coerce.number().int().min(0).max(16).default(0),
});

export type Env = z.infer<typeof envSchema> & { appUrl: string; dataDir: string; outboxDir: string; storageDir: string };

export function loadEnv(source: NodeJS.ProcessEnv = process.env): Env {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.')}: ${issue.message}`);
    throw new Error(`Bad configuration in .env or the environment:\n${lines.join('\n')}`);
  }
  const env = parsed.data;
  const dataDir = path.resolve(env.DATA_DIR);
  return {
    ...env,
    appUrl: (env.APP_URL ?? `http://${env.HOST}:${env.PORT}`).replace(/\/$/, ''),
    dataDir,
    outboxDir: path.join(dataDir, 'outbox'),
    storageDir: path.join(dataDir, 'storage'),
  };
}

export const env = loadEnv();
