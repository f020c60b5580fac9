import os from 'node:os';
import { DEFAULT_QUEUE_PREFIX } from './queue-names.js';

/** Standalone worker settings, validated once. Workers never open SQLite: they need only Redis. */
export interface WorkerConfig {
  redisUrl: string;
  concurrency: number;
  /** Compute threads; default one per chunk in flight. */
  threads: number;
  workerId: string;
  queuePrefix: string;
}

export function loadWorkerConfig(env: NodeJS.ProcessEnv = process.env): WorkerConfig {
  const redisUrl = env.REDIS_URL?.trim();
  if (!redisUrl) throw new Error('REDIS_URL is required for a standalone worker (e.g. redis://127.0.0.1:6379)');
  if (!/^rediss?:\/\//.test(redisUrl)) throw new Error('REDIS_URL must start with redis:// or rediss://');
  const concurrency = env.WORKER_CONCURRENCY ? Number(env.WORKER_CONCURRENCY) : 1;
  if (!Number.isInteger(concurrency) || concurrency < 1 || concurrency > 64) {
    throw new Error('WORKER_CONCURRENCY must be a whole number from 1 to 64');
  }
  const threads = env.WORKER_THREADS ? Number(env.WORKER_THREADS) : concurrency;
  if (!Number.isInteger(threads) || threads < 0 || threads > 64)
    throw new Error('WORKER_THREADS must be a whole number from 0 to 64');
  const queuePrefix = env.QUEUE_PREFIX?.trim() || DEFAULT_QUEUE_PREFIX;
  if (!/^[A-Za-z0-9_-]{1,32}$/.test(queuePrefix)) throw new Error('QUEUE_PREFIX must be 1–32 letters, digits, - or _');
  return { redisUrl, concurrency, threads, workerId: `${os.hostname()}:${process.pid}`, queuePrefix };
}
