// The two backends the queue contract runs against: the embedded in-memory Redis and a
// real redis-server (REDIS_TEST_URL, or one spawned from /usr/bin/redis-server).
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { createServer } from 'node:net';
import { Redis } from 'ioredis';
import { createEmbeddedRedis, resetEmbeddedRedis } from '../../api/src/queue/embedded-redis/index.js';

export interface QueueBackend {
  name: 'embedded' | 'redis-server';
  /** A fresh connection; BullMQ duplicates it for its blocking commands. */
  connect(): Redis;
  /** Closes every connection handed out and stops what was started. */
  shutdown(): Promise<void>;
}

const REDIS_SERVER = '/usr/bin/redis-server';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

async function waitForPing(url: string, child: ChildProcess | null): Promise<void> {
  const deadline = Date.now() + 10000;
  let lastError: unknown;
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null) throw new Error(`redis-server exited with code ${child.exitCode}`);
    const probe = new Redis(url, { lazyConnect: true, maxRetriesPerRequest: 0, retryStrategy: () => null });
    probe.on('error', () => undefined);
    try {
      await probe.connect();
      await probe.ping();
      probe.disconnect();
      return;
    } catch (e) {
      lastError = e;
      probe.disconnect();
      await new Promise((r) => setTimeout(r, 100));
    }
  }
  throw new Error(`redis-server at ${url} did not answer PING: ${String(lastError)}`);
}

export function embeddedBackend(): QueueBackend {
  const conns: Redis[] = [];
  const name = `contract-${process.pid}`;
  return {
    name: 'embedded',
    connect() {
      const c = createEmbeddedRedis({ name });
      conns.push(c);
      return c;
    },
    async shutdown() {
      for (const c of conns.splice(0)) c.disconnect();
      resetEmbeddedRedis();
    },
  };
}

/**
 * A real Redis, or null when none can be had. Never silently null under CI=true:
 * the caller turns that into a failing test.
 */
export async function realBackend(): Promise<QueueBackend | null> {
  let url = process.env.REDIS_TEST_URL;
  let child: ChildProcess | null = null;
  if (!url) {
    if (!existsSync(REDIS_SERVER)) return null;
    const port = await freePort();
    child = spawn(REDIS_SERVER, ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no'], {
      stdio: 'ignore',
    });
    url = `redis://127.0.0.1:${port}`;
  }
  await waitForPing(url, child);
  const conns: Redis[] = [];
  const target = url;
  return {
    name: 'redis-server',
    connect() {
      const c = new Redis(target, { maxRetriesPerRequest: null });
      conns.push(c);
      return c;
    },
    async shutdown() {
      for (const c of conns.splice(0)) c.disconnect();
      if (child && child.exitCode === null) {
        const exited = new Promise((r) => child?.once('exit', r));
        child.kill('SIGTERM');
        await exited;
      }
    },
  };
}
