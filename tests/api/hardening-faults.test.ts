import { isActiveState } from '@driftgrid/domain';
import Database from 'better-sqlite3';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { Queue } from 'bullmq';
import { Redis } from 'ioredis';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CHUNK_QUEUE } from '../../worker/src/queue-names.js';
import { DEMO, startTestApp, tempDataDir } from '../support/app.js';
import { apiJson, apiLogin, freePort, REPO, spawnNode, startApiProcess, type Proc } from '../support/processes.js';
import { realRedis, type RedisHandle } from '../support/redis.js';
import { smallSweep } from '../support/sweeps.js';

/*
 * Faults: kill -9 of the api and of a standalone worker at moments a seeded PRNG picks, during
 * sweeps on a real Redis; every sweep ends with exactly its points and an archived export keeps its
 * SHA-256 across the restarts. A DATA_DIR that cannot be written gives a clear start-up error; a
 * full database (max_page_count) fails the sweep with a clear message and no corruption.
 */

const redis: RedisHandle | null = await realRedis();
const procs: Proc[] = [];
const dirs: string[] = [];
afterAll(async () => {
  for (const p of procs) await p.kill('SIGKILL');
  await redis?.stop();
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

function prng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let x = Math.imul(a ^ (a >>> 15), 1 | a);
    x = (x + Math.imul(x ^ (x >>> 7), 61 | x)) ^ x;
    return ((x ^ (x >>> 14)) >>> 0) / 4294967296;
  };
}

async function sha256Of(baseUrl: string, token: string, id: number): Promise<string> {
  const r = await fetch(`${baseUrl}/api/sweeps/${id}/export`, { headers: { authorization: `Bearer ${token}` } });
  expect(r.status).toBe(200);
  return createHash('sha256')
    .update(Buffer.from(await r.arrayBuffer()))
    .digest('hex');
}

describe.runIf(redis)('kill -9 of the api and of a standalone worker at seeded random moments', () => {
  const SEED = 9_2025;
  const rand = prng(SEED);
  let dataDir: string;
  let env: Record<string, string>;
  let api: { proc: Proc; baseUrl: string };
  let worker: Proc;

  const startWorker = () => {
    worker = spawnNode('worker/dist/main.js', {
      REDIS_URL: redis!.url,
      QUEUE_PREFIX: env.QUEUE_PREFIX,
      WORKER_CONCURRENCY: '2',
      WORKER_THREADS: '1',
    });
    procs.push(worker);
  };
  const startApi = async () => {
    api = await startApiProcess(env);
    procs.push(api.proc);
  };

  beforeAll(async () => {
    dataDir = tempDataDir();
    dirs.push(dataDir);
    env = { DATA_DIR: dataDir, REDIS_URL: redis!.url, QUEUE_PREFIX: `dgfault${process.pid}`, CHUNK_SIZE: '1000' };
    await startApi();
    startWorker();
  });

  it('finishes every sweep with exactly its points; the archived export keeps its SHA-256', async () => {
    let token = await apiLogin(api.baseUrl, DEMO.researcher);
    // An archived sweep first: its frozen download is compared after every restart.
    const small = await apiJson(api.baseUrl, token, 'POST', '/api/sweeps', smallSweep({ name: 'fault archive scan' }));
    expect(small.status).toBe(201);
    const archivedId = small.body.id as number;
    const waitDone = async (id: number, ms: number) => {
      const deadline = Date.now() + ms;
      for (;;) {
        const r = await apiJson(api.baseUrl, token, 'GET', `/api/sweeps/${id}`).catch(() => null);
        if (r?.status === 200 && !isActiveState(r.body.status)) return r.body;
        if (Date.now() > deadline)
          throw new Error(
            `sweep ${id} not finished: ${JSON.stringify(r?.body?.progress)}\napi:\n${api.proc.output()}\nworker:\n${worker.output()}`,
          );
        await new Promise((res) => setTimeout(res, 100));
      }
    };
    expect((await waitDone(archivedId, 60_000)).status).toBe('completed');
    const archived = await apiJson(api.baseUrl, token, 'POST', `/api/sweeps/${archivedId}/archive`);
    expect(archived.status).toBe(200);
    const frozenSha = archived.body.archive.sha256 as string;
    expect(await sha256Of(api.baseUrl, token, archivedId)).toBe(frozenSha);

    const ROUNDS = 3;
    const sweeps: { id: number; points: number }[] = [];
    for (let round = 0; round < ROUNDS; round++) {
      const created = await apiJson(
        api.baseUrl,
        token,
        'POST',
        '/api/sweeps',
        smallSweep({
          name: `fault round ${round}`,
          axes: [
            { param: 'Te_eV', kind: 'log', min: 1, max: 1000, count: 100 },
            { param: 'B_T', kind: 'linear', min: 0.1, max: 5, count: 400 },
          ],
        }),
      );
      expect(created.status).toBe(201);
      const id = created.body.id as number;
      sweeps.push({ id, points: created.body.points });
      const victim = rand() < 0.5 ? 'api' : 'worker';
      const delay = Math.floor(rand() * 1500);
      await new Promise((r) => setTimeout(r, delay));
      console.log(
        `fault round ${round} (seed ${SEED}): kill -9 of the ${victim} ${delay} ms after submitting sweep ${id}`,
      );
      if (victim === 'api') {
        await api.proc.kill('SIGKILL');
        await startApi();
        token = await apiLogin(api.baseUrl, DEMO.researcher);
      } else {
        await worker.kill('SIGKILL');
        startWorker();
      }
      expect(await sha256Of(api.baseUrl, token, archivedId)).toBe(frozenSha);
    }
    for (const s of sweeps) {
      const done = await waitDone(s.id, 180_000);
      expect(done.status, `sweep ${s.id}`).toBe('completed');
      expect(done.progress.done).toBe(s.points);
    }
    // A final kill -9 of both, then the counts straight from SQLite.
    await api.proc.kill('SIGKILL');
    await worker.kill('SIGKILL');
    const db = new Database(path.join(dataDir, 'driftgrid.db'), { readonly: true });
    for (const s of sweeps) {
      const base = s.id * 2 ** 32;
      const stats = db
        .prepare('SELECT COUNT(*) n, MIN(id) - ? lo, MAX(id) - ? hi FROM results WHERE id BETWEEN ? AND ?')
        .get(base, base, base, base + 2 ** 32 - 1);
      // Rowids are unique: count = points with min 0 and max points-1 means every idx once.
      expect(stats, `sweep ${s.id}`).toEqual({ n: s.points, lo: 0, hi: s.points - 1 });
    }
    expect((db.pragma('integrity_check') as { integrity_check: string }[])[0].integrity_check).toBe('ok');
    db.close();
    await startApi();
    token = await apiLogin(api.baseUrl, DEMO.researcher);
    expect(await sha256Of(api.baseUrl, token, archivedId)).toBe(frozenSha);
  });
});

/** Longest wait accepted between a worker's kill -9 and its chunk being given back (BullMQ defaults gave 30–64 s). */
const RECOVERY_BOUND_MS = 30_000;

describe.runIf(redis)('a standalone worker killed while it holds a chunk', () => {
  it(`has the chunk given back to a live worker within ${RECOVERY_BOUND_MS / 1000} s`, async () => {
    const dataDir = tempDataDir();
    dirs.push(dataDir);
    const prefix = `dgkill${process.pid}`;
    const api = await startApiProcess({
      DATA_DIR: dataDir,
      REDIS_URL: redis!.url,
      QUEUE_PREFIX: prefix,
      CHUNK_SIZE: '1000',
    });
    procs.push(api.proc);
    const workerEnv = { REDIS_URL: redis!.url, QUEUE_PREFIX: prefix, WORKER_CONCURRENCY: '1', WORKER_THREADS: '1' };
    const connection = new Redis(redis!.url, { maxRetriesPerRequest: null });
    const queue = new Queue(CHUNK_QUEUE, { connection, prefix });
    try {
      // Two workers on the queue; both have started before the kill, so no start-up is measured.
      const doomed = spawnNode('worker/dist/main.js', workerEnv);
      const survivor = spawnNode('worker/dist/main.js', workerEnv);
      procs.push(doomed, survivor);
      const started = Date.now();
      while ((await queue.getWorkers()).length < 2) {
        if (Date.now() - started > 60_000)
          throw new Error(`workers did not connect:\n${doomed.output()}\n${survivor.output()}`);
        await new Promise((r) => setTimeout(r, 100));
      }
      // The column profile (nr = 256) takes about a millisecond a point: chunks of 1,000 run for a while.
      const definition = JSON.parse(fs.readFileSync(path.join(REPO, 'examples', 'argon-column-width.json'), 'utf8'));
      definition.name = 'worker kill scan';
      definition.axes[0].count = 2000; // × 3 fields = 6,000 points, 6 chunks
      const token = await apiLogin(api.baseUrl, DEMO.researcher);
      const created = await apiJson(api.baseUrl, token, 'POST', '/api/sweeps', definition);
      expect(created.status).toBe(201);
      const id = created.body.id as number;
      // Kill the first worker as soon as it holds a chunk.
      const doomedPid = doomed.child.pid;
      let held: string[] = [];
      for (const deadline = Date.now() + 60_000; Date.now() < deadline && !held.length;) {
        const active = await queue.getActive();
        held = active.map((j) => j.id!).filter(Boolean);
        if (!held.length) await new Promise((r) => setTimeout(r, 20));
      }
      expect(held.length, 'a chunk became active').toBeGreaterThan(0);
      await doomed.kill('SIGKILL');
      const killedAt = Date.now();
      console.log(`worker ${doomedPid} killed holding one of ${held.join(', ')}`);
      // Every chunk active at the kill either finishes (the survivor's) or is given back and finishes.
      const pending = new Set(held);
      let recoveredMs = 0;
      while (pending.size && Date.now() - killedAt < 120_000) {
        for (const jobId of [...pending]) {
          const job = await queue.getJob(jobId);
          const state = job ? await job.getState() : 'gone';
          if (state !== 'active' || (job?.processedOn ?? 0) > killedAt) {
            pending.delete(jobId);
            recoveredMs = Math.max(recoveredMs, Date.now() - killedAt);
          }
        }
        await new Promise((r) => setTimeout(r, 100));
      }
      console.log(`chunks held at the kill were free again after ${(recoveredMs / 1000).toFixed(1)} s`);
      expect([...pending], 'chunks still held by the killed worker').toEqual([]);
      expect(recoveredMs).toBeLessThan(RECOVERY_BOUND_MS);
      // And the sweep finishes with exactly its points.
      for (const deadline = Date.now() + 120_000; ;) {
        const r = await apiJson(api.baseUrl, token, 'GET', `/api/sweeps/${id}`);
        if (r.body.status === 'completed') {
          expect(r.body.progress.done).toBe(6000);
          break;
        }
        if (!isActiveState(r.body.status) || Date.now() > deadline)
          throw new Error(`sweep ${id} ${r.body.status}: ${JSON.stringify(r.body.progress)}\n${survivor.output()}`);
        await new Promise((res) => setTimeout(res, 200));
      }
    } finally {
      await queue.close();
      connection.disconnect();
    }
  });
});

describe('a DATA_DIR that cannot be written', () => {
  const startFails = async (dataDir: string) => {
    const port = await freePort();
    const proc = spawnNode('api/dist/main.js', {
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATA_DIR: dataDir,
      LOG_LEVEL: 'warn',
    });
    procs.push(proc);
    const code = await proc.exited;
    return { code, out: proc.output() };
  };

  it('gives a clear start-up error when DATA_DIR lies under a file', async () => {
    const dir = tempDataDir();
    dirs.push(dir);
    const file = path.join(dir, 'not-a-directory');
    fs.writeFileSync(file, 'x');
    const { code, out } = await startFails(path.join(file, 'data'));
    expect(code).not.toBe(0);
    expect(out).toMatch(/DATA_DIR|data director/i);
    expect(out, 'no stack trace').not.toMatch(/\n\s+at .+:\d+:\d+/);
  });

  it('gives a clear start-up error when driftgrid.db is a directory', async () => {
    const dir = tempDataDir();
    dirs.push(dir);
    fs.mkdirSync(path.join(dir, 'driftgrid.db'));
    const { code, out } = await startFails(dir);
    expect(code).not.toBe(0);
    expect(out).toMatch(/driftgrid\.db|database/i);
    expect(out, 'no stack trace').not.toMatch(/\n\s+at .+:\d+:\d+/);
  });
});

describe('a full database', () => {
  it('keeps serving, never reports the sweep complete with missing points, and passes integrity_check', async () => {
    const t = await startTestApp();
    try {
      const token = await t.login(DEMO.researcher);
      const db = t.sqlite();
      // Simulated full disk: this connection (the app's only writer) may grow by 20 pages; SQLITE_FULL beyond.
      const pages = (db.pragma('page_count') as { page_count: number }[])[0].page_count;
      db.pragma(`max_page_count = ${pages + 20}`);
      const created = await t.http
        .post('/api/sweeps')
        .set({ authorization: `Bearer ${token}` })
        .send(
          smallSweep({
            name: 'disk full scan',
            axes: [
              { param: 'Te_eV', kind: 'log', min: 1, max: 1000, count: 100 },
              { param: 'B_T', kind: 'linear', min: 0.1, max: 5, count: 500 },
            ],
          }),
        );
      expect(created.status).toBeLessThan(500);
      if (created.status === 201) {
        // Give the persistence time to hit the limit several times.
        let last: { status: string; progress: { done: number; total: number } } | undefined;
        for (let i = 0; i < 50; i++) {
          last = (await t.http.get(`/api/sweeps/${created.body.id}`).set({ authorization: `Bearer ${token}` })).body;
          if (!isActiveState(last!.status)) break;
          await new Promise((r) => setTimeout(r, 200));
        }
        console.log(`full database: sweep is ${last!.status} at ${last!.progress.done}/${last!.progress.total}`);
        expect(last!.status).not.toBe('completed');
        // It fails with a reason naming the full database instead of staying "running" for ever.
        expect(last!.status).toBe('failed');
        expect((last as unknown as { error: string }).error).toMatch(/database is full/);
        const n = (
          db
            .prepare('SELECT COUNT(*) n FROM results WHERE id >= ? AND id < ?')
            .get(created.body.id * 2 ** 32, (created.body.id + 1) * 2 ** 32) as { n: number }
        ).n;
        expect(n).toBeLessThan(created.body.points);
      } else {
        expect(created.body.message).toMatch(/full|space|disk/i);
      }
      expect((await t.http.get('/api/health')).status).toBe(200);
      expect((await t.http.get('/api/sweeps').set({ authorization: `Bearer ${token}` })).status).toBe(200);
      expect((db.pragma('integrity_check') as { integrity_check: string }[])[0].integrity_check).toBe('ok');
      db.pragma('max_page_count = 1073741823');
    } finally {
      await t.close();
    }
  });
});
