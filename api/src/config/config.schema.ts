import { z } from 'zod';

/** Default secret for development only; production refuses to start with it. */
export const DEV_JWT_SECRET = 'driftgrid-development-secret-change-me';

const optionalUrl = z
  .string()
  .trim()
  .transform((v) => (v === '' ? undefined : v))
  .optional();

/** Environment variables, validated once at start. */
export const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  HOST: z.string().default('0.0.0.0'),
  DATA_DIR: z.string().min(1).default('./data'),
  JWT_SECRET: z.string().min(16, 'JWT_SECRET must be at least 16 characters').default(DEV_JWT_SECRET),
  JWT_EXPIRES_IN: z.string().default('8h'),
  REDIS_URL: optionalUrl,
  SMTP_URL: optionalUrl,
  MAIL_FROM: z.string().default('Driftgrid <driftgrid@localhost>'),
  PUBLIC_URL: optionalUrl,
  /** Seed the demo users on a new database (always in development; production only when set). */
  DEMO_SEED: z.enum(['auto', 'true', 'false']).default('auto'),
  /** Demo sweeps, dataset and fit on top of the demo users (`auto`: not under NODE_ENV=test). */
  DEMO_CONTENT: z.enum(['auto', 'true', 'false']).default('auto'),
  /** Production refuses demo users and the default secret unless this is set (for a trial install). */
  ALLOW_INSECURE_DEMO: z.enum(['true', 'false']).default('false'),
  /** Compute threads inside the api; default 1 without REDIS_URL, 0 with it (standalone workers). */
  EMBEDDED_WORKERS: z.coerce.number().int().min(0).max(64).optional(),
  QUEUE_PREFIX: z
    .string()
    .regex(/^[A-Za-z0-9_-]{1,32}$/, '1–32 letters, digits, - or _')
    .default('dg'),
  CHUNK_SIZE: z.coerce.number().int().min(100).max(100_000).default(5000),
  UI_DIST: z.string().optional(),
  LOG_LEVEL: z.enum(['debug', 'info', 'warn', 'error', 'silent']).default('info'),
  UPLOAD_MAX_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(20 * 1024 * 1024),
  UPLOAD_MAX_ROWS: z.coerce.number().int().positive().default(200_000),
  /** Sign-in and password-reset attempts per IP and e-mail address per window (default 10; 1000 under NODE_ENV=test). */
  LOGIN_THROTTLE_LIMIT: z.coerce.number().int().min(1).optional(),
  LOGIN_THROTTLE_TTL_MS: z.coerce.number().int().min(1000).default(60_000),
  /** Heavy-read pool (sorted/filtered result pages, plot series, fit sources): threads; 0 reads on the api thread. */
  READ_THREADS: z.coerce.number().int().min(0).max(32).default(2),
  /** Time allowed per heavy read before it is stopped with a 503. */
  READ_BUDGET_MS: z.coerce.number().int().min(100).max(600_000).default(5000),
  /** Concurrent heavy reads per user, and how long one more waits for a slot before a 429. */
  READ_PER_USER: z.coerce.number().int().min(1).max(64).default(2),
  READ_WAIT_MS: z.coerce.number().int().min(0).max(60_000).default(2000),
  /** Heavy reads waiting for a pool thread before the api answers busy (503). */
  READ_QUEUE_MAX: z.coerce.number().int().min(1).max(10_000).default(64),
  /** Memory for cached orders of sorted views (4 MB per 10^6 rows); 0 turns the cache off. */
  READ_ORDER_CACHE_MB: z.coerce.number().min(0).max(4096).default(64),
});

export type Env = z.infer<typeof envSchema>;
