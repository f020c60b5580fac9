/**
 * Scenario 3: the same sweep with a real Redis and standalone worker processes (the api computes
 * nothing: EMBEDDED_WORKERS=0). Skipped with a note when no redis-server is at hand.
 */
import fs from 'node:fs';
import { spawnNode, type Proc } from '../../support/processes.js';
import { realRedis } from '../../support/redis.js';
import { startApi, stopProc, warmUp } from '../lib/api.js';
import type { BenchConfig } from '../lib/config.js';
import { crossFieldGrid } from '../lib/definitions.js';
import { measuredSweep } from '../lib/measured-sweep.js';
import type { Report } from '../lib/report.js';
import { track } from '../lib/resources.js';
import { reportSweep, WARM_UP_POINTS } from './sweep-embedded.js';

function redisAvailable(): boolean {
  return (
    !!process.env.REDIS_TEST_URL ||
    ['/usr/bin/redis-server', '/usr/local/bin/redis-server'].some((p) => fs.existsSync(p))
  );
}

async function waitForOutput(proc: Proc, text: string, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!proc.output().includes(text)) {
    if (proc.child.exitCode !== null) throw new Error(`worker exited early:\n${proc.output()}`);
    if (Date.now() > deadline)
      throw new Error(`worker did not report "${text}" within ${timeoutMs} ms:\n${proc.output()}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

export async function benchRedisSweep(cfg: BenchConfig, report: Report): Promise<void> {
  const scenario = '3 redis';
  console.log(
    `\n[3] ${cfg.sweepPoints.toLocaleString('en-US')}-point sweep on a real Redis with ${cfg.workers} worker processes`,
  );
  if (!redisAvailable()) {
    report.add({
      scenario,
      metric: 'real Redis + workers',
      value: 'skipped',
      unit: '',
      note: 'no redis-server (install redis-server or set REDIS_TEST_URL)',
    });
    report.note('scenario 3 skipped: no redis-server found (/usr/bin/redis-server) and REDIS_TEST_URL unset');
    return;
  }
  const redis = await realRedis();
  if (!redis) {
    report.add({
      scenario,
      metric: 'real Redis + workers',
      value: 'skipped',
      unit: '',
      note: 'redis-server unavailable',
    });
    return;
  }
  const stopRedis = track('redis-server', () => redis.stop());
  // A prefix of our own: REDIS_TEST_URL may be a Redis other suites share.
  const prefix = `bench${process.pid}`;
  const common = { REDIS_URL: redis.url, QUEUE_PREFIX: prefix };
  const stops: (() => Promise<void>)[] = [];
  try {
    // Workers boot while the api does (they need only Redis); the sweep waits for all of them.
    const workers: Proc[] = [];
    for (let w = 0; w < cfg.workers; w++) {
      const proc = spawnNode('worker/dist/main.js', {
        ...common,
        WORKER_CONCURRENCY: String(cfg.workerConcurrency),
        LOG_LEVEL: 'warn',
      });
      stops.push(track(`worker ${w}`, () => stopProc(proc)));
      workers.push(proc);
    }
    const api = await startApi('redis', { ...common, EMBEDDED_WORKERS: '0' });
    stops.unshift(() => api.stop());
    for (const proc of workers) await waitForOutput(proc, 'started', 60_000);
    const warmUpMs = await warmUp(api, crossFieldGrid(WARM_UP_POINTS));
    report.add({
      scenario,
      metric: `first sweep after start (${WARM_UP_POINTS.toLocaleString('en-US')} pts, warm-up)`,
      value: warmUpMs / 1000,
      unit: 's',
      note: 'not in the figures below',
    });
    const m = await measuredSweep(api, crossFieldGrid(cfg.sweepPoints));
    reportSweep(report, scenario, `${cfg.workers} workers × concurrency ${cfg.workerConcurrency}:`, m, !cfg.quick);
    const share = m.run.workers.map((w) => `${w.id} ${w.points.toLocaleString('en-US')} pts`).join('; ');
    if (share)
      report.add({ scenario, metric: 'points per worker', value: m.run.workers.length, unit: 'workers', note: share });
    report.detail('redisSweep', { workers: cfg.workers, concurrency: cfg.workerConcurrency, ...m });
  } finally {
    // Workers first (stops holds the api first, workers after: reversed), then the api, then Redis.
    for (const stop of stops.reverse()) await stop();
    await stopRedis();
  }
}
