import { isActiveState } from '@driftgrid/domain';
import Database from 'better-sqlite3';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tempDataDir } from '../support/app.js';
import { apiJson, apiLogin, spawnNode, startApiProcess, type Proc } from '../support/processes.js';
import { realRedis, type RedisHandle } from '../support/redis.js';
import { smallSweep } from '../support/sweeps.js';

const redis: RedisHandle | null = await realRedis();
const procs: Proc[] = [];
const dirs: string[] = [];

describe.runIf(redis)('scale-out: api plus two standalone workers on a real Redis', () => {
  let baseUrl: string;
  let dataDir: string;
  const prefix = `dgtest${process.pid}`;

  beforeAll(async () => {
    dataDir = tempDataDir();
    dirs.push(dataDir);
    const env = { REDIS_URL: redis!.url, QUEUE_PREFIX: prefix };
    const api = await startApiProcess({ ...env, DATA_DIR: dataDir, CHUNK_SIZE: '1000' });
    procs.push(api.proc);
    baseUrl = api.baseUrl;
    for (let i = 0; i < 2; i++) {
      const w = spawnNode('worker/dist/main.js', { ...env, WORKER_CONCURRENCY: '2', WORKER_THREADS: '1' });
      procs.push(w);
    }
    // Wait until both workers say they started.
    const deadline = Date.now() + 20_000;
    while (!procs.slice(1).every((p) => p.output().includes('started'))) {
      if (Date.now() > deadline)
        throw new Error(`workers did not start:\n${procs.map((p) => p.output()).join('\n---\n')}`);
      await new Promise((r) => setTimeout(r, 100));
    }
  });

  afterAll(async () => {
    for (const p of procs) await p.kill('SIGTERM');
    await redis?.stop();
    for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
  });

  it('completes a sweep whose provenance shows both workers, with the exact row count', async () => {
    const token = await apiLogin(baseUrl, 'researcher@example.com');
    const def = smallSweep({
      name: 'scale-out scan',
      axes: [
        { param: 'Te_eV', kind: 'log', min: 1, max: 1000, count: 100 },
        { param: 'B_T', kind: 'linear', min: 0.1, max: 5, count: 400 },
      ],
    });
    const created = await apiJson(baseUrl, token, 'POST', '/api/sweeps', def);
    expect(created.status).toBe(201);
    const id = created.body.id as number;
    const deadline = Date.now() + 120_000;
    let s;
    for (;;) {
      s = (await apiJson(baseUrl, token, 'GET', `/api/sweeps/${id}`)).body;
      if (!isActiveState(s.status)) break;
      if (Date.now() > deadline) throw new Error(`sweep still ${s.status}: ${JSON.stringify(s.progress)}`);
      await new Promise((r) => setTimeout(r, 100));
    }
    expect(s.status).toBe('completed');
    expect(s.progress.done).toBe(40_000);
    const workers = s.provenance.workers as { id: string; chunks: number; points: number }[];
    const pids = procs.slice(1).map((p) => String(p.child.pid));
    expect(workers.map((w) => w.id.split(':').pop()).sort()).toEqual(pids.sort());
    expect(workers.reduce((a, w) => a + w.points, 0)).toBe(40_000);
    expect(workers.reduce((a, w) => a + w.chunks, 0)).toBe(40);

    const db = new Database(path.join(dataDir, 'driftgrid.db'), { readonly: true });
    const base = id * 2 ** 32;
    const stats = db
      .prepare('SELECT COUNT(*) n, MIN(id) - ? lo, MAX(id) - ? hi FROM results WHERE id BETWEEN ? AND ?')
      .get(base, base, base, base + 2 ** 32 - 1);
    expect(stats).toEqual({ n: 40_000, lo: 0, hi: 39_999 });
    db.close();
  });
});
