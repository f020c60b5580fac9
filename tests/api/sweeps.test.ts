import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let researcher: string;
let reviewer: string;
let admin: string;
beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  reviewer = await t.login(DEMO.reviewer);
  admin = await t.login(DEMO.admin);
});
afterAll(async () => {
  await t?.close();
});

const auth = (token: string) => ({ authorization: `Bearer ${token}` });

describe('sweep preview', () => {
  it('counts points and chunks, estimates time and shows a sample point', async () => {
    const res = await t.http.post('/api/sweeps/preview').set(auth(researcher)).send(smallSweep());
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ ok: true, points: 35, chunks: 1 });
    expect(res.body.estimate.seconds).toBeGreaterThan(0);
    expect(res.body.sample.inputs.Te_eV).toBeCloseTo(1, 12);
    expect(res.body.sample.inputs.Ti_eV).toBeCloseTo(res.body.sample.inputs.Te_eV, 12);
  });

  it('reports every definition error with its path', async () => {
    const res = await t.http
      .post('/api/sweeps/preview')
      .set(auth(researcher))
      .send(
        smallSweep({
          axes: [
            { param: 'Te_eV', kind: 'log', min: -1, max: 100, count: 7 },
            { param: 'nonsense', kind: 'linear', min: 0, max: 1, count: 2 },
          ],
        }),
      );
    expect(res.status).toBe(200);
    expect(res.body.ok).toBe(false);
    const paths = res.body.errors.map((e: { path: string }) => e.path);
    expect(paths.some((p: string) => p.startsWith('axes.0'))).toBe(true);
    expect(paths.some((p: string) => p.startsWith('axes.1'))).toBe(true);
  });

  it('refuses a body that is not a JSON object with a 400 naming the body, on preview and submit alike', async () => {
    for (const url of ['/api/sweeps/preview', '/api/sweeps']) {
      for (const body of [[smallSweep()], []]) {
        const res = await t.http.post(url).set(auth(researcher)).send(body);
        expect(res.status, `${url} ${JSON.stringify(body).slice(0, 40)}`).toBe(400);
        expect(res.body.details).toEqual([{ path: 'body', message: 'the sweep definition must be a JSON object' }]);
      }
    }
  });

  it('still reports a structural error and a model error together (the envelope check does not short-circuit)', async () => {
    const res = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(
        smallSweep({
          name: 42,
          axes: [{ param: 'nonsense', kind: 'linear', min: 0, max: 1, count: 2 }],
        }),
      );
    expect(res.status).toBe(400);
    const paths = (res.body.details as { path: string }[]).map((e) => e.path);
    expect(paths).toContain('name');
    expect(paths.some((p) => p.startsWith('axes.0'))).toBe(true);
  });

  it('is closed to reviewers', async () => {
    const res = await t.http.post('/api/sweeps/preview').set(auth(reviewer)).send(smallSweep());
    expect(res.status).toBe(403);
  });
});

describe('sweep life cycle', () => {
  it('runs a sweep to completion with exactly its points and provenance', async () => {
    const res = await t.http.post('/api/sweeps').set(auth(researcher)).send(smallSweep());
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'queued', points: 35 });
    const done = await waitForSweep(t, researcher, res.body.id);
    expect(done.status).toBe('completed');
    expect(done.progress).toMatchObject({ done: 35, total: 35 });
    expect(done.provenance.workers.reduce((a: number, w: { points: number }) => a + w.points, 0)).toBe(35);
    expect(done.provenance.workers[0].id).toMatch(/^.+:\d+$/);
    expect(done.provenance.modelVersion).toBeTruthy();
    expect(done.owner.email).toBe(DEMO.researcher);
    // Exactly one stored row per point, indices 0..34 with no gaps.
    const rows = t
      .sqlite()
      .prepare('SELECT id - ? * 4294967296 AS idx FROM results WHERE id BETWEEN ? AND ? ORDER BY id')
      .all(done.id, done.id * 2 ** 32, (done.id + 1) * 2 ** 32 - 1) as { idx: number }[];
    expect(rows.map((r) => r.idx)).toEqual(Array.from({ length: 35 }, (_, i) => i));
  });

  it('rejects a bad definition with 400 naming the field', async () => {
    const res = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ model: 'no-such-model' }));
    expect(res.status).toBe(400);
    expect(res.body.details.map((d: { path: string }) => d.path)).toContain('model');
  });

  it('answers 400 with every problem, each with its field label and a message free of paths', async () => {
    const res = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(
        smallSweep({
          name: '',
          fixed: { Ti_eV: 'Te_eVV' },
          axes: [
            { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 7 },
            { param: 'B_T', kind: 'linear', min: 0.05, max: 500, count: 5 },
          ],
        }),
      );
    expect(res.status).toBe(400);
    const details = res.body.details as { path: string; label: string; message: string }[];
    expect(details.map((d) => [d.path, d.label])).toEqual(
      expect.arrayContaining([
        ['name', 'Name'],
        ['fixed.Ti_eV', 'T_i fixed value'],
        ['axes.1.max', 'B axis · To'],
      ]),
    );
    expect(details.find((d) => d.path === 'fixed.Ti_eV')!.message).toBe(
      'unknown input or output `Te_eVV`; did you mean `Te_eV`?',
    );
    expect(res.body.message).toMatch(/^Invalid sweep definition: Name: must not be empty \(and 2 more\)$/);
  });

  it('refuses over quota in the admin’s words: the limit, what is used and what the sweep would add', async () => {
    const me = await t.http.get('/api/auth/me').set(auth(researcher));
    const userId = me.body.user?.id ?? me.body.id;
    const put = await t.http.put(`/api/admin/quotas/users/${userId}`).set(auth(admin)).send({ maxPointsPerSweep: 20 });
    expect(put.status).toBe(200);
    try {
      const preview = await t.http.post('/api/sweeps/preview').set(auth(researcher)).send(smallSweep());
      expect(preview.body.quota.violations).toEqual([
        expect.objectContaining({
          limit: 'maxPointsPerSweep',
          label: 'Points per sweep',
          usage: 0,
          requested: 35,
          message: 'limit 20 points; this sweep has 35',
        }),
      ]);
      const res = await t.http.post('/api/sweeps').set(auth(researcher)).send(smallSweep());
      expect(res.status).toBe(429);
      expect(res.body.message).toBe('Quota exceeded — Points per sweep: limit 20 points; this sweep has 35');
      expect(res.body.details[0]).toMatchObject({ path: 'maxPointsPerSweep', label: 'Points per sweep' });
    } finally {
      await t.http.put(`/api/admin/quotas/users/${userId}`).set(auth(admin)).send({ maxPointsPerSweep: null });
    }
  });

  it('hides a private sweep from other users with 404 and lets admins see it', async () => {
    const res = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ name: 'private one' }));
    const id = res.body.id;
    await waitForSweep(t, researcher, id);
    expect((await t.http.get(`/api/sweeps/${id}`).set(auth(reviewer))).status).toBe(404);
    expect((await t.http.get(`/api/sweeps/${id}`).set(auth(admin))).status).toBe(200);
    expect((await t.http.delete(`/api/sweeps/${id}`).set(auth(reviewer))).status).toBe(403);
  });

  it('summarises the queue in chunks and sweeps with true totals, and pauses and resumes', async () => {
    const res = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ name: 'queue count' }));
    expect((await waitForSweep(t, researcher, res.body.id)).status).toBe('completed');
    const q = await t.http.get('/api/admin/queue').set(auth(admin));
    expect(q.status).toBe(200);
    expect(Object.keys(q.body.chunks).sort()).toEqual(['completed', 'computing', 'failed', 'retrying', 'waiting']);
    // Completed chunks are the ones SQLite holds as done, not the queue library's trimmed count.
    const done = t.sqlite().prepare(`SELECT COUNT(*) AS n FROM sweep_chunks WHERE state = 'done'`).get() as {
      n: number;
    };
    expect(done.n).toBeGreaterThan(0);
    expect(q.body.chunks.completed).toBe(done.n);
    expect(q.body).not.toHaveProperty('counts');
    expect(typeof q.body.sweepsRunning).toBe('number');
    const paused = await t.http.post('/api/admin/queue/pause').set(auth(admin));
    expect(paused.body.paused).toBe(true);
    const resumed = await t.http.post('/api/admin/queue/resume').set(auth(admin));
    expect(resumed.body.paused).toBe(false);
  });

  it('cancels a queued sweep and refuses to cancel it twice', async () => {
    const big = smallSweep({
      name: 'to cancel',
      axes: [
        { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 400 },
        { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 500 },
      ],
    });
    // Paused, the queue hands out no chunks, so the sweep is certainly still queued when cancelled.
    await t.http.post('/api/admin/queue/pause').set(auth(admin));
    const res = await t.http.post('/api/sweeps').set(auth(researcher)).send(big);
    expect(res.status).toBe(201);
    const c = await t.http.post(`/api/sweeps/${res.body.id}/cancel`).set(auth(researcher));
    await t.http.post('/api/admin/queue/resume').set(auth(admin));
    expect(c.status).toBe(200);
    expect(c.body.status).toBe('cancelled');
    expect(c.body.progress.done).toBe(0);
    const q = await t.http.get('/api/admin/queue').set(auth(admin));
    expect(q.body.chunks.waiting).toBe(0);
    const again = await t.http.post(`/api/sweeps/${res.body.id}/cancel`).set(auth(researcher));
    expect(again.status).toBe(409);
    const del = await t.http.delete(`/api/sweeps/${res.body.id}`).set(auth(researcher));
    expect(del.status).toBe(204);
    expect((await t.http.get(`/api/sweeps/${res.body.id}`).set(auth(researcher))).status).toBe(404);
  });
});

describe('queue administration', () => {
  it('shows counts to admins only and pauses and resumes the queue', async () => {
    expect((await t.http.get('/api/admin/queue').set(auth(researcher))).status).toBe(403);
    const s = await t.http.get('/api/admin/queue').set(auth(admin));
    expect(s.status).toBe(200);
    expect(s.body).toMatchObject({ mode: 'embedded', paused: false });
    expect(typeof s.body.chunks.waiting).toBe('number');
    const p = await t.http.post('/api/admin/queue/pause').set(auth(admin));
    expect(p.body.paused).toBe(true);
    const r = await t.http.post('/api/admin/queue/resume').set(auth(admin));
    expect(r.body.paused).toBe(false);
    // Both are admin actions in the audit log, in words.
    const log = await t.http.get('/api/admin/audit').set(auth(admin));
    const summaries = (log.body.items as { action: string; summary: string }[]).map((e) => [e.action, e.summary]);
    expect(summaries).toEqual(
      expect.arrayContaining([
        ['queue.pause', 'Paused the queue: no new chunks handed out'],
        ['queue.resume', 'Resumed the queue'],
      ]),
    );
  });
});
