import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { DEV_JWT_SECRET, envSchema, type Env } from './config.schema.js';
import { weakSecretReason } from './secret-strength.js';

/** Typed configuration: the environment validated once, with derived paths. */
export interface AppConfig {
  env: Env['NODE_ENV'];
  port: number;
  host: string;
  dataDir: string;
  dbFile: string;
  archiveDir: string;
  jwtSecret: string;
  jwtExpiresIn: string;
  redisUrl?: string;
  smtpUrl?: string;
  mailFrom: string;
  publicUrl: string;
  seedDemo: boolean;
  seedDemoContent: boolean;
  /** ALLOW_INSECURE_DEMO: production may run with demo users and the default secret (a trial). */
  allowInsecureDemo: boolean;
  /** undefined = automatic (1 embedded, 0 with REDIS_URL). */
  embeddedWorkers?: number;
  chunkSize: number;
  queuePrefix: string;
  uiDist: string;
  logLevel: Env['LOG_LEVEL'];
  uploadMaxBytes: number;
  uploadMaxRows: number;
  /** Attempts per IP+e-mail per window on sign-in and password reset (the IP alone gets 5×). */
  loginThrottleLimit: number;
  loginThrottleTtlMs: number;
  appVersion: string;
  /** The heavy-read pool (api/src/reads). */
  reads: {
    threads: number;
    budgetMs: number;
    perUser: number;
    waitMs: number;
    maxQueue: number;
    orderCacheBytes: number;
  };
}

export const APP_CONFIG = Symbol('APP_CONFIG');

export class ConfigError extends Error {}

const here = path.dirname(fileURLToPath(import.meta.url));
const repoRoot = path.resolve(here, '../../..');

function readAppVersion(): string {
  const require = createRequire(import.meta.url);
  return (require(path.join(repoRoot, 'package.json')) as { version: string }).version;
}

export function loadConfig(source: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = envSchema.safeParse(source);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`Invalid configuration:\n  ${lines.join('\n  ')}`);
  }
  const e = parsed.data;
  const insecureAllowed = e.ALLOW_INSECURE_DEMO === 'true';
  const seedDemo = e.DEMO_SEED === 'true' || (e.DEMO_SEED === 'auto' && e.NODE_ENV !== 'production');
  if (e.NODE_ENV === 'production' && !insecureAllowed) {
    if (e.JWT_SECRET === DEV_JWT_SECRET) {
      throw new ConfigError(
        'Refusing to start in production with the default JWT_SECRET; set JWT_SECRET (or ALLOW_INSECURE_DEMO=true for a trial).',
      );
    }
    const weak = weakSecretReason(e.JWT_SECRET);
    if (weak) {
      throw new ConfigError(
        `Refusing to start in production: JWT_SECRET is too easy to guess (${weak}). Use a long random value, for example the output of \`openssl rand -base64 48\`.`,
      );
    }
    if (seedDemo) {
      throw new ConfigError(
        'Refusing to seed demo users in production; unset DEMO_SEED (or ALLOW_INSECURE_DEMO=true for a trial).',
      );
    }
  }
  const dataDir = path.resolve(e.DATA_DIR);
  return {
    env: e.NODE_ENV,
    port: e.PORT,
    host: e.HOST,
    dataDir,
    dbFile: path.join(dataDir, 'driftgrid.db'),
    archiveDir: path.join(dataDir, 'archives'),
    jwtSecret: e.JWT_SECRET,
    jwtExpiresIn: e.JWT_EXPIRES_IN,
    redisUrl: e.REDIS_URL,
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    publicUrl: e.PUBLIC_URL ?? `http://localhost:${e.PORT}`,
    seedDemo,
    allowInsecureDemo: insecureAllowed,
    seedDemoContent: seedDemo && (e.DEMO_CONTENT === 'true' || (e.DEMO_CONTENT === 'auto' && e.NODE_ENV !== 'test')),
    embeddedWorkers: e.EMBEDDED_WORKERS,
    chunkSize: e.CHUNK_SIZE,
    queuePrefix: e.QUEUE_PREFIX,
    uiDist: e.UI_DIST ? path.resolve(e.UI_DIST) : path.join(repoRoot, 'ui', 'dist'),
    logLevel: e.LOG_LEVEL,
    uploadMaxBytes: e.UPLOAD_MAX_BYTES,
    uploadMaxRows: e.UPLOAD_MAX_ROWS,
    // Test suites sign in many times from one address; a dedicated test sets a low limit.
    loginThrottleLimit: e.LOGIN_THROTTLE_LIMIT ?? (e.NODE_ENV === 'test' ? 1000 : 10),
    loginThrottleTtlMs: e.LOGIN_THROTTLE_TTL_MS,
    appVersion: readAppVersion(),
    reads: {
      threads: e.READ_THREADS,
      budgetMs: e.READ_BUDGET_MS,
      perUser: e.READ_PER_USER,
      waitMs: e.READ_WAIT_MS,
      maxQueue: e.READ_QUEUE_MAX,
      orderCacheBytes: Math.round(e.READ_ORDER_CACHE_MB * 1024 * 1024),
    },
  };
}
