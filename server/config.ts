import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { z } from 'zod';

// Configuration is read once from the environment and validated; a bad value stops the start with a
// list of what is wrong. Ports default away from the well-known ones so a system PostgreSQL or a
// developer's own mail catcher do not collide with ours.

export const ROOT = resolve(import.meta.dirname, '..');
export const DATA_DIR = resolve(ROOT, '.data');

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'test', 'production']).default('development'),
  PORT: z.coerce.number().int().min(1).max(65535).default(5180),
  HOST: z.string().default('127.0.0.1'),
  PUBLIC_URL: z.string().url().optional(),
  DATABASE_URL: z.string().optional(),
  PG_PORT: z.coerce.number().int().min(1024).max(65535).default(54329),
  PG_DATABASE: z.string().regex(/^[a-z_][a-z0-9_]*$/).default('crownwatch'),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().default(1925),
  SMTP_SECURE: z.enum(['true', 'false']).default('false'),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default('Crownwatch <no-reply@crownwatch.local>'),
  MAIL_WEB_PORT: z.coerce.number().int().default(1980),
  JWT_SECRET: z.string().min(32).optional(),
  SESSION_MINUTES: z.coerce.number().int().min(5).max(24 * 60).default(120),
  LOGIN_LIMIT: z.coerce.number().int().min(1).default(10),
  BCRYPT_COST: z.coerce.number().int().min(10).max(15).default(11),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  COOKIE_SECURE: z.enum(['true', 'false', 'auto']).default('auto'),
  JOBS: z.enum(['on', 'off']).default('on'),
  /** A piece whose last reading is older than this many days cannot ship without a QC override. */
  SHIP_READING_MAX_AGE_DAYS: z.coerce.number().int().min(1).max(365).default(14),
  /** Seconds new flags wait before the digest goes out, so a burst of flags makes one e-mail. */
  ALERT_DIGEST_SECONDS: z.coerce.number().int().min(0).default(300),
  /** Seconds a reading waits before its piece is recomputed, so readings in a burst cause one run. */
  PROJECTION_DELAY_SECONDS: z.coerce.number().int().min(0).default(5),
  /** Seconds after which a projection batch a worker took and never finished (the process died) is run again. */
  PROJECTION_EXPIRE_SECONDS: z.coerce.number().int().min(1).default(300),
  /** Threads the nightly run's batches are projected in (0: the server's own thread). */
  PROJECTION_THREADS: z.coerce.number().int().min(0).max(16).default(2),
  /** Seconds between the queue's housekeeping rounds (expired jobs back to the queue, old ones archived). */
  JOB_MAINTENANCE_SECONDS: z.coerce.number().int().min(1).default(120),
});

export type Config = z.infer<typeof envSchema> & { databaseUrl: string; jwtSecret: string; publicUrl: string };

/** The connection string of the project-local cluster for a database name. */
export const localDatabaseUrl = (port: number, db: string): string => `postgres://crownwatch@127.0.0.1:${port}/${db}`;

/** The signing secret: from config, or generated once into a git-ignored file (never a default in code). */
function jwtSecret(given: string | undefined, env: string): string {
  if (given) return given;
  if (env === 'production') throw new Error('JWT_SECRET must be set in production (32 characters or more)');
  const file = resolve(DATA_DIR, 'jwt-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dirname(file), { recursive: true });
  const secret = randomBytes(48).toString('base64url');
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Configuration is not valid:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  return {
    ...c,
    databaseUrl: c.DATABASE_URL ?? localDatabaseUrl(c.PG_PORT, c.PG_DATABASE),
    jwtSecret: jwtSecret(c.JWT_SECRET, c.NODE_ENV),
    publicUrl: c.PUBLIC_URL ?? `http://${c.HOST === '0.0.0.0' ? 'localhost' : c.HOST}:${c.PORT}`,
  };
}
