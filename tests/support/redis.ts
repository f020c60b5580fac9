import { spawn } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import { freePort } from './processes.js';

export interface RedisHandle {
  url: string;
  stop(): Promise<void>;
}

/**
 * A real Redis for the suites that need one: REDIS_TEST_URL when set (CI starts one), else a
 * redis-server spawned on a loopback port. Outside CI a missing server skips; with CI=true it fails.
 */
export async function realRedis(): Promise<RedisHandle | null> {
  if (process.env.REDIS_TEST_URL) return { url: process.env.REDIS_TEST_URL, stop: async () => undefined };
  const bin = ['/usr/bin/redis-server', '/usr/local/bin/redis-server'].find((p) => fs.existsSync(p));
  if (!bin) {
    if (process.env.CI === 'true')
      throw new Error('CI requires a real redis-server (REDIS_TEST_URL or /usr/bin/redis-server)');
    console.warn(
      '\n!!! REAL-REDIS SUITE SKIPPED: no redis-server (apt-get install redis-server or set REDIS_TEST_URL) !!!\n',
    );
    return null;
  }
  const port = await freePort();
  const child = spawn(bin, ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no'], {
    stdio: 'ignore',
  });
  const url = `redis://127.0.0.1:${port}`;
  const deadline = Date.now() + 10_000;
  for (;;) {
    const ok = await new Promise<boolean>((resolve) => {
      const s = net.connect(port, '127.0.0.1', () => {
        s.end();
        resolve(true);
      });
      s.on('error', () => resolve(false));
    });
    if (ok) break;
    if (Date.now() > deadline) throw new Error('redis-server did not start');
    await new Promise((r) => setTimeout(r, 50));
  }
  return {
    url,
    stop: async () => {
      child.kill('SIGTERM');
    },
  };
}
