import { randomUUID } from 'node:crypto';
import { Redis } from 'ioredis';
import type { AppConfig } from '../config/app-config.js';
import { createEmbeddedRedis } from './embedded-redis/index.js';

export interface QueueConnection {
  mode: 'embedded' | 'redis';
  connection: Redis;
}

/**
 * One code path for both modes: BullMQ gets an ioredis-compatible connection, either the in-memory
 * fake (no REDIS_URL; it vanishes with the process, so chunks are re-enqueued from SQLite at start)
 * or a real Redis shared with standalone workers.
 */
export function createQueueConnection(config: Pick<AppConfig, 'redisUrl'>): QueueConnection {
  if (config.redisUrl) {
    return { mode: 'redis', connection: new Redis(config.redisUrl, { maxRetriesPerRequest: null }) };
  }
  // A data set of its own per app instance: two apps in one process (tests) must not share a queue.
  return {
    mode: 'embedded',
    connection: createEmbeddedRedis({ name: `driftgrid-${randomUUID()}` }) as unknown as Redis,
  };
}
