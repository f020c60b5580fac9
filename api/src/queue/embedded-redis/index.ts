// Public entry: an in-memory Redis that BullMQ 6.7 accepts as its `connection`.
import type { Redis } from 'ioredis';
import { EmbeddedRedis, isEmbeddedRedisInstance, type EmbeddedRedisOptions } from './embedded-redis.js';
import { clearAllStores } from './store.js';

export { EmbeddedRedis, type EmbeddedRedisOptions };

/**
 * A Redis-compatible connection backed by memory. Connections (and their duplicates)
 * created with the same `name` share one data set.
 */
export function createEmbeddedRedis(options: EmbeddedRedisOptions = {}): Redis {
  return new EmbeddedRedis(options) as unknown as Redis;
}

export function isEmbeddedRedis(conn: unknown): boolean {
  return isEmbeddedRedisInstance(conn);
}

/** Deletes all keys of every embedded data set (for test isolation); connections stay usable. */
export function resetEmbeddedRedis(): void {
  clearAllStores();
}
