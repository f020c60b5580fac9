import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { HeavyReads } from '../../api/src/reads/heavy-reads.js';
import { ReadBudgetError } from '../../api/src/reads/read-errors.js';
import { OrderCache } from '../../api/src/reads/order-cache.js';
import type { PooledHeavyReads } from '../../api/src/reads/read-pool.js';
import { ResultsReader } from '../../api/src/sweeps/results-reader.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

/*
 * The heavy-read pool (issue 14 §1) under load, checked by behaviour, never by timings: loopback
 * only (supertest), every request bounded by the app's own budget, the suite stops by itself.
 * Threads are held busy with the pool's test task `sleep` (a stand-in for a long statement), given a
 * long budget of its own, so a queue, a full user or a busy pool can be made on purpose.
 */

let t: TestApp;
let reads: PooledHeavyReads;
let researcher: string;
let reviewer: string;
let researcherId: number;
let sweepId: number;
const BUDGET_MS = 1500;

/** Holds one pool thread for `ms` on behalf of `userId` (budget long enough not to interfere). */
const hold = (userId: number, ms: number) => reads.run(userId, { kind: 'sleep', ms }, { budgetMs: 60_000 });

async function until(check: () => boolean, timeoutMs = 5000): Promise<boolean> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (check()) return true;
    await new Promise((r) => setTimeout(r, 20));
  }
  return check();
}

/** Waits until both pool threads have loaded (a thread ended over budget is replaced; loading takes seconds). */
const warm = () => until(() => reads.stats.ready >= 2, 60_000);

beforeAll(async () => {
  t = await startTestApp({
    READ_THREADS: '2',
    READ_BUDGET_MS: String(BUDGET_MS),
    READ_PER_USER: '1',
    READ_WAIT_MS: '300',
    READ_QUEUE_MAX: '8',
  });
  reads = t.app.get(HeavyReads) as PooledHeavyReads;
  researcher = await t.login(DEMO.researcher);
  reviewer = await t.login(DEMO.reviewer);
  researcherId = (t.sqlite().prepare('SELECT id FROM users WHERE email = ?').get(DEMO.researcher) as { id: number }).id;
  const res = await t.http
    .post('/api/sweeps')
    .set('authorization', `Bearer ${researcher}`)
    .send(
      smallSweep({
        name: 'read pool scan',
        axes: [
          { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 40 },
          { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 30 },
        ],
      }),
    );
  expect(res.status).toBe(201);
  sweepId = res.body.id;
  await waitForSweep(t, researcher, sweepId);
  const shared = await t.http
    .put(`/api/sweeps/${sweepId}/sharing`)
    .set('authorization', `Bearer ${researcher}`)
    .send({ visibility: 'group', userIds: [] });
  expect(shared.status).toBe(200);
  expect(await warm()).toBe(true);
});

afterAll(async () => {
  await t?.close();
});

const sorted = (token: string, sort: string, page = 1) =>
  t.http
    .get(`/api/sweeps/${sweepId}/results?page=${page}&pageSize=50&sort=${sort}`)
    .set('authorization', `Bearer ${token}`);

describe('heavy reads run on the pool, bounded and fair', () => {
  it('runs on worker threads (the built thread entry is found)', () => {
    expect(reads.mode).toBe('pool');
  });

  it('says on /api/health how many read threads have loaded', async () => {
    await warm();
    const h = await t.http.get('/api/health');
    expect(h.status).toBe(200);
    expect(h.body.reads).toEqual({ mode: 'pool', threads: 2, ready: 2 });
  });

  it('keeps /api/health and the catalogue answering while every pool thread is busy', async () => {
    let done = 0;
    const busy = [hold(9001, 2500), hold(9002, 2500)].map((p) => p.then(() => done++));
    await until(() => reads.stats.threads >= 2 || done > 0, 2000);
    const health = await t.http.get('/api/health');
    const list = await t.http.get('/api/sweeps?page=1&pageSize=5').set('authorization', `Bearer ${researcher}`);
    expect(health.status).toBe(200);
    expect(list.status).toBe(200);
    // Both answers came while the long reads were still holding their threads.
    expect(done).toBe(0);
    await Promise.all(busy);
  });

  it('answers 503 with advice when a read outlives its budget, and the pool carries on', async () => {
    await warm();
    const busy = [hold(9001, BUDGET_MS + 2500), hold(9002, BUDGET_MS + 2500)];
    await new Promise((r) => setTimeout(r, 50));
    const res = await sorted(reviewer, 'vE_ms:desc');
    expect(res.status).toBe(503);
    expect(res.body.message).toMatch(/narrow the filter/i);
    expect(res.headers['retry-after']).toBeDefined();
    await Promise.all(busy);
    // The same read on an idle pool is served.
    const again = await sorted(reviewer, 'vE_ms:desc');
    expect(again.status).toBe(200);
    expect(again.body.rows).toHaveLength(50);
  });

  it('ends the thread of a read that runs past its budget (a running task, not only a queued one)', async () => {
    await expect(reads.run(9003, { kind: 'sleep', ms: 10_000 }, { budgetMs: 200 })).rejects.toBeInstanceOf(
      ReadBudgetError,
    );
    // A fresh thread takes the next read.
    await expect(reads.run(9003, { kind: 'sleep', ms: 1 })).resolves.toEqual({ slept: 1 });
  });

  it('refuses a second concurrent heavy read of the same user with 429, while another user is served', async () => {
    await warm();
    const mine = hold(researcherId, 2000);
    await new Promise((r) => setTimeout(r, 50));
    const excess = await sorted(researcher, 'vDi_ms:asc');
    expect(excess.status).toBe(429);
    expect(excess.body.message).toMatch(/already have 1 large read/);
    expect(excess.headers['retry-after']).toBeDefined();
    const other = await sorted(reviewer, 'vDi_ms:asc');
    expect(other.status).toBe(200);
    await mine;
    expect((await sorted(researcher, 'vDi_ms:asc')).status).toBe(200);
  });

  it("reads a dataset's columns (plot overlays, fit sources) on the pool, within the user's share", async () => {
    const up = await t.http
      .post('/api/datasets')
      .set('authorization', `Bearer ${researcher}`)
      .attach('file', Buffer.from('V,I,note\n-4,0.5,a\n-2,,b\n0,2.25,c\n2,,d\n4,8.5,e\n'), 'probe-sweep.csv');
    expect(up.status).toBe(201);
    const series = () =>
      t.http.get(`/api/datasets/${up.body.id}/series?x=V&y=I`).set('authorization', `Bearer ${researcher}`);
    await warm();
    const mine = hold(researcherId, 2000);
    await new Promise((r) => setTimeout(r, 50));
    // The user's one heavy-read slot is taken: the overlay waits, then is refused like any heavy read.
    const excess = await series();
    expect(excess.status).toBe(429);
    await mine;
    const ok = await series();
    expect(ok.status).toBe(200);
    // Empty cells are gaps, skipped; the rest in row order.
    expect(ok.body.points).toEqual({ x: [-4, 0, 4], y: [0.5, 2.25, 8.5] });
    expect(ok.body.total).toBe(3);
  });

  it("waits for room in the user's share instead of refusing an export partway through the file", async () => {
    await warm();
    // The user's one heavy-read slot is held for longer than a read may wait for it (READ_WAIT_MS).
    const mine = hold(researcherId, 1200);
    await new Promise((r) => setTimeout(r, 50));
    const res = await t.http
      .get(`/api/sweeps/${sweepId}/export`)
      .set('authorization', `Bearer ${researcher}`)
      .buffer(true)
      .parse((response, done) => {
        const parts: Buffer[] = [];
        response.on('data', (c: Buffer) => parts.push(c));
        response.on('end', () => done(null, Buffer.concat(parts)));
      });
    await mine;
    expect(res.status).toBe(200);
    const { unzipSync, strFromU8 } = await import('fflate');
    const files = unzipSync(new Uint8Array(res.body as Buffer));
    const csv = strFromU8(files['results.csv']!);
    // Header plus every one of the 1,200 points: nothing was cut short by the wait.
    expect(csv.trimEnd().split('\n')).toHaveLength(1201);
    expect(JSON.parse(strFromU8(files['manifest.json']!)).results.rows).toBe(1200);
  });

  it('frees the slot and the queue place of a request whose client went away', async () => {
    await warm();
    const busy = [hold(9001, 3000), hold(9002, 3000)];
    let finished = false;
    void Promise.all(busy).then(() => (finished = true));
    await new Promise((r) => setTimeout(r, 50));
    // The client gives up after 300 ms; its read is still waiting for a thread.
    await expect(sorted(researcher, 'B_T:desc').timeout(300)).rejects.toThrow(/timeout/i);
    const freed = await until(() => reads.slots.active(researcherId) === 0 && reads.stats.queued === 0, 2000);
    expect(freed).toBe(true);
    expect(finished).toBe(false);
    await Promise.all(busy);
    expect((await sorted(researcher, 'B_T:desc')).status).toBe(200);
  });
});

describe('sorted pages (order computed once, later pages from the cache)', () => {
  /** SQLite's own ORDER BY is the reference for the order computed in JavaScript. */
  function sqlPage(column: string, desc: boolean, page: number, where = ''): number[] {
    const layout = JSON.parse(
      (t.sqlite().prepare('SELECT columns FROM sweeps WHERE id = ?').get(sweepId) as { columns: string }).columns,
    ) as { name: string; slot: string }[];
    const slot = layout.find((c) => c.name === column)!.slot;
    const base = sweepId * 2 ** 32;
    return (
      t
        .sqlite()
        .prepare(
          `SELECT id - ${base} AS i FROM results WHERE id BETWEEN ? AND ? ${where} ORDER BY ${slot} IS NULL, ${slot} ${desc ? 'DESC' : 'ASC'}, id ASC LIMIT 50 OFFSET ?`,
        )
        .all(base, base + 2 ** 32 - 1, (page - 1) * 50) as { i: number }[]
    ).map((r) => r.i);
  }

  it('gives the same pages as SQLite ORDER BY, first page computed, later pages cached', async () => {
    for (const [col, desc] of [
      ['rho_i_over_Ln', true],
      ['vE_ms', false],
      ['Te_eV', true],
    ] as const) {
      for (const page of [1, 2, 24]) {
        const res = await sorted(reviewer, `${col}:${desc ? 'desc' : 'asc'}`, page);
        expect(res.status).toBe(200);
        expect(res.body.total).toBe(1200);
        expect(res.body.rows.map((r: { idx: number }) => r.idx)).toEqual(sqlPage(col, desc, page));
      }
    }
  });

  it('filters and sorts together, with the filtered total', async () => {
    const filter = encodeURIComponent(JSON.stringify({ Te_eV: { gte: 5, lte: 50 } }));
    const res = await t.http
      .get(`/api/sweeps/${sweepId}/results?page=2&pageSize=50&sort=vDi_ms:desc&filter=${filter}`)
      .set('authorization', `Bearer ${reviewer}`);
    expect(res.status).toBe(200);
    const layout = JSON.parse(
      (t.sqlite().prepare('SELECT columns FROM sweeps WHERE id = ?').get(sweepId) as { columns: string }).columns,
    ) as { name: string; slot: string }[];
    const te = layout.find((c) => c.name === 'Te_eV')!.slot;
    const expected = sqlPage('vDi_ms', true, 2, `AND ${te} >= 5 AND ${te} <= 50`);
    expect(res.body.rows.map((r: { idx: number }) => r.idx)).toEqual(expected);
    const n = t
      .sqlite()
      .prepare(`SELECT COUNT(*) AS n FROM results WHERE id BETWEEN ? AND ? AND ${te} >= 5 AND ${te} <= 50`)
      .get(sweepId * 2 ** 32, (sweepId + 1) * 2 ** 32 - 1) as { n: number };
    expect(res.body.total).toBe(n.n);
  });

  it("reads a new view's next pages ahead with its first page: the following pages need no pool work", async () => {
    await warm();
    const reader = t.app.get(ResultsReader);
    expect(await until(() => reader.buildsInProgress === 0, 30_000)).toBe(true);
    const asked: string[] = [];
    const run = reads.run.bind(reads);
    const spy = vi.spyOn(reads, 'run').mockImplementation((userId, task, options) => {
      asked.push(task.kind);
      // No whole order is ever built here, so whatever the next pages get comes from the first page's pass.
      if (task.kind === 'order') return Promise.reject(new Error('no whole order in this test'));
      return run(userId, task, options);
    });
    try {
      // A view nobody asked for yet: its first page is one top-k pass on the pool …
      const first = await sorted(reviewer, 'vDe_ms:desc', 1);
      expect(first.body.rows.map((r: { idx: number }) => r.idx)).toEqual(sqlPage('vDe_ms', true, 1));
      expect(asked.filter((k) => k === 'page')).toHaveLength(1);
      // … which also carried the next pages: asked at once, before the whole order exists, none goes to SQL.
      const next = await Promise.all([2, 3, 11, 20].map((p) => sorted(researcher, 'vDe_ms:desc', p)));
      next.forEach((res, i) => {
        expect(res.status).toBe(200);
        expect(res.body.total).toBe(1200);
        expect(res.body.rows.map((r: { idx: number }) => r.idx)).toEqual(sqlPage('vDe_ms', true, [2, 3, 11, 20][i]!));
      });
      expect(asked.filter((k) => k === 'page')).toHaveLength(1);
    } finally {
      spy.mockRestore();
    }
  });

  it('answers an uncached sorted page by SQL, then builds the whole order in the background for later pages', async () => {
    await warm();
    const cache = t.app.get(OrderCache);
    const reader = t.app.get(ResultsReader);
    // Builds started by earlier tests finish first (one runs at a time; a view asked meanwhile is not queued).
    expect(await until(() => reader.buildsInProgress === 0, 30_000)).toBe(true);
    const before = cache.size;
    // A view nobody asked for yet; pages 1 and 7 asked at once, before any order exists.
    const [first, seventh] = await Promise.all([
      sorted(reviewer, 'rho_i_over_Ln:asc', 1),
      sorted(researcher, 'rho_i_over_Ln:asc', 7),
    ]);
    expect(first.body.rows.map((r: { idx: number }) => r.idx)).toEqual(sqlPage('rho_i_over_Ln', false, 1));
    expect(seventh.body.rows.map((r: { idx: number }) => r.idx)).toEqual(sqlPage('rho_i_over_Ln', false, 7));
    // One background build for the view (deduplicated), which lands in the cache.
    expect(await until(() => reader.buildsInProgress === 0 && cache.size === before + 1, 30_000)).toBe(true);
    // With every pool thread held, a later page of that view is still served: from the cache, on the api.
    const busy = [hold(9001, 2500), hold(9002, 2500)];
    await new Promise((r) => setTimeout(r, 50));
    const later = await sorted(reviewer, 'rho_i_over_Ln:asc', 19);
    expect(later.status).toBe(200);
    expect(later.body.total).toBe(1200);
    expect(later.body.rows.map((r: { idx: number }) => r.idx)).toEqual(sqlPage('rho_i_over_Ln', false, 19));
    await Promise.all(busy);
  });
});
