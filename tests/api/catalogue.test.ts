/**
 * Catalogue api: who sees which sweep (list and results), paging totals, sorting and range filters
 * checked against direct SQL on the stored rows, injection attempts, plot series bounds, sharing.
 */
import bcrypt from 'bcryptjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '../../api/src/seed/demo-users.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
const tok: Record<'owner' | 'other' | 'reviewer' | 'admin', string> = { owner: '', other: '', reviewer: '', admin: '' };
const ids = { private: 0, shared: 0, archived: 0, group: 0 };
let reviewerId = 0;
let otherId = 0;

const auth = (token: string) => ({ authorization: `Bearer ${token}` });
const span = (id: number) => [id * 2 ** 32, (id + 1) * 2 ** 32 - 1] as const;

async function submit(body: Record<string, unknown>): Promise<number> {
  const res = await t.http.post('/api/sweeps').set(auth(tok.owner)).send(smallSweep(body));
  expect(res.status).toBe(201);
  await waitForSweep(t, tok.owner, res.body.id);
  return res.body.id as number;
}

/** Slot of a column in the results table, read from the sweep's stored layout. */
function slotOf(id: number, name: string): string {
  const { columns } = t.sqlite().prepare('SELECT columns FROM sweeps WHERE id = ?').get(id) as { columns: string };
  const slot = (JSON.parse(columns) as { name: string; slot: string }[]).find((c) => c.name === name)!.slot;
  expect(slot).toMatch(/^c\d+$/);
  return slot;
}

beforeAll(async () => {
  t = await startTestApp();
  // A second researcher, inserted directly (the invitation flow is tested elsewhere).
  const now = Date.now();
  otherId = Number(
    t
      .sqlite()
      .prepare(
        `INSERT INTO users (email, name, role, password_hash, active, failed_logins, created_at, updated_at)
    VALUES ('second.researcher@example.com', 'Second Researcher', 'researcher', ?, 1, 0, ?, ?)`,
      )
      .run(bcrypt.hashSync(DEMO_PASSWORD, 4), now, now).lastInsertRowid,
  );
  tok.owner = await t.login(DEMO.researcher);
  tok.other = await t.login('second.researcher@example.com');
  tok.reviewer = await t.login(DEMO.reviewer);
  tok.admin = await t.login(DEMO.admin);
  reviewerId = (t.sqlite().prepare('SELECT id FROM users WHERE email = ?').get(DEMO.reviewer) as { id: number }).id;

  ids.private = await submit({ name: 'Argon private scan', tags: ['argon', 'private-tag'] });
  ids.shared = await submit({ name: 'Argon shared scan', tags: ['argon', 'shared-tag'] });
  ids.archived = await submit({
    name: 'Deuterium archived scan',
    tags: ['deuterium'],
    fixed: { ...smallSweep().fixed, mu: 2 },
  });
  ids.group = await submit({ name: 'Argon group scan', tags: ['argon'], visibility: 'group' });
  const share = await t.http
    .put(`/api/sweeps/${ids.shared}/sharing`)
    .set(auth(tok.owner))
    .send({ visibility: 'private', userIds: [reviewerId] });
  expect(share.status).toBe(200);
  expect(share.body.sharedWith).toEqual([reviewerId]);
  // The archive route belongs to another module; the fixture sets the state directly.
  t.sqlite()
    .prepare(`UPDATE sweeps SET status = 'archived', archived_at = ? WHERE id = ?`)
    .run(Date.now(), ids.archived);
}, 120_000);

afterAll(async () => {
  await t?.close();
});

async function listIds(token: string, query: Record<string, string | number> = {}): Promise<number[]> {
  const res = await t.http
    .get('/api/sweeps')
    .query({ pageSize: 1000, ...query })
    .set(auth(token));
  expect(res.status).toBe(200);
  return res.body.items.map((s: { id: number }) => s.id);
}

describe('visibility matrix', () => {
  // [sweep, owner, other researcher, reviewer, admin] — SPEC §1.
  const matrix: [keyof typeof ids, boolean, boolean, boolean, boolean][] = [
    ['private', true, false, false, true],
    ['shared', true, false, true, true],
    ['archived', true, true, true, true],
    ['group', true, true, true, true],
  ];
  const who = ['owner', 'other', 'reviewer', 'admin'] as const;

  it.each(matrix)('%s sweep: owner %s, other researcher %s, reviewer %s, admin %s', async (kind, ...expected) => {
    for (let i = 0; i < who.length; i++) {
      const token = tok[who[i]];
      const listed = (await listIds(token)).includes(ids[kind]);
      expect(listed, `${who[i]} lists ${kind}`).toBe(expected[i]);
      const results = await t.http.get(`/api/sweeps/${ids[kind]}/results`).set(auth(token));
      expect(results.status, `${who[i]} reads ${kind}`).toBe(expected[i] ? 200 : 404);
      const series = await t.http
        .get(`/api/sweeps/${ids[kind]}/series`)
        .query({ x: 'Te_eV', y: 'vDi_ms' })
        .set(auth(token));
      expect(series.status, `${who[i]} plots ${kind}`).toBe(expected[i] ? 200 : 404);
    }
  });

  it('scopes: mine, shared with me, archived', async () => {
    expect((await listIds(tok.owner, { scope: 'mine' })).sort()).toEqual(Object.values(ids).sort());
    expect(await listIds(tok.reviewer, { scope: 'mine' })).toEqual([]);
    expect((await listIds(tok.reviewer, { scope: 'shared' })).sort()).toEqual([ids.shared, ids.group].sort());
    expect(await listIds(tok.other, { scope: 'shared' })).toEqual([ids.group]);
    expect(await listIds(tok.reviewer, { scope: 'archived' })).toEqual([ids.archived]);
    const owned = await t.http.get('/api/sweeps').query({ owner: 'me' }).set(auth(tok.other));
    expect(owned.body.total).toBe(0);
  });

  it('marks what is shared with the caller and names no e-mail in the list', async () => {
    const res = await t.http.get('/api/sweeps').query({ scope: 'shared' }).set(auth(tok.reviewer));
    const shared = res.body.items.find((s: { id: number }) => s.id === ids.shared);
    expect(shared.sharedWithMe).toBe(true);
    expect(JSON.stringify(res.body)).not.toContain('@example.com');
  });
});

describe('catalogue filters, sorting and paging', () => {
  it('filters by tag, model, status, text, points and dates', async () => {
    expect((await listIds(tok.owner, { tag: 'argon' })).sort()).toEqual([ids.private, ids.shared, ids.group].sort());
    expect(await listIds(tok.owner, { tag: 'argon,shared-tag' })).toEqual([ids.shared]);
    expect(await listIds(tok.owner, { status: 'archived' })).toEqual([ids.archived]);
    expect((await listIds(tok.owner, { status: 'archived,completed' })).length).toBe(4);
    expect(await listIds(tok.owner, { model: 'parallel-balance' })).toEqual([]);
    expect((await listIds(tok.owner, { model: 'cross-field' })).length).toBe(4);
    expect(await listIds(tok.owner, { q: 'deuterium' })).toEqual([ids.archived]);
    expect(await listIds(tok.owner, { q: "%' OR 1=1 --" })).toEqual([]);
    expect((await listIds(tok.owner, { minPoints: 35, maxPoints: 35 })).length).toBe(4);
    expect(await listIds(tok.owner, { minPoints: 36 })).toEqual([]);
    expect(await listIds(tok.owner, { createdTo: '2000-01-01' })).toEqual([]);
    expect((await listIds(tok.owner, { createdFrom: '2000-01-01', finishedFrom: '2000-01-01T00:00:00Z' })).length).toBe(
      4,
    );
  });

  it('pages with a stable total and sorts by name', async () => {
    const all = await listIds(tok.owner, { sort: 'name:asc' });
    const seen: number[] = [];
    for (let page = 1; page <= 3; page++) {
      const res = await t.http.get('/api/sweeps').query({ page, pageSize: 3, sort: 'name:asc' }).set(auth(tok.owner));
      expect(res.body).toMatchObject({ total: 4, page, pageSize: 3 });
      seen.push(...res.body.items.map((s: { id: number }) => s.id));
    }
    expect(seen).toEqual(all);
    const names = (
      t
        .sqlite()
        .prepare(
          `SELECT id FROM sweeps WHERE owner_id = (SELECT id FROM users WHERE email = ?) ORDER BY name COLLATE NOCASE`,
        )
        .all(DEMO.researcher) as { id: number }[]
    ).map((r) => r.id);
    expect(all).toEqual(names);
    expect(await listIds(tok.owner, { sort: 'name:desc' })).toEqual([...names].reverse());
  });

  it('rejects bad parameters with 400 naming them', async () => {
    const cases: [Record<string, string | number>, string][] = [
      [{ pageSize: 1001 }, 'pageSize'],
      [{ page: 0 }, 'page'],
      [{ sort: 'owner_id:asc' }, 'sort'],
      [{ status: 'done' }, 'status.0'],
      [{ scope: 'everything' }, 'scope'],
      [{ createdFrom: 'yesterday' }, 'createdFrom'],
      [{ owner: 'someone' }, 'owner'],
    ];
    for (const [query, path] of cases) {
      const res = await t.http.get('/api/sweeps').query(query).set(auth(tok.owner));
      expect(res.status, JSON.stringify(query)).toBe(400);
      expect(res.body.details.map((d: { path: string }) => d.path)).toContain(path);
    }
    const unknown = await t.http.get('/api/sweeps').query({ colour: 'red' }).set(auth(tok.owner));
    expect(unknown.status).toBe(400);
    expect(unknown.body.message).toMatch(/colour/);
  });
});

describe('results', () => {
  it('sorts by an output with a range filter exactly as SQL does', async () => {
    const id = ids.private;
    const [lo, hi] = span(id);
    const te = slotOf(id, 'Te_eV');
    const v = slotOf(id, 'vDi_ms');
    const expected = t
      .sqlite()
      .prepare(
        `SELECT id - ? AS idx, ${v} AS v FROM results WHERE id BETWEEN ? AND ? AND ${te} >= 2 AND ${te} <= 50 ORDER BY ${v} DESC, id`,
      )
      .all(lo, lo, hi) as { idx: number; v: number }[];
    expect(expected.length).toBeGreaterThan(5);
    expect(expected.length).toBeLessThan(35);
    const res = await t.http
      .get(`/api/sweeps/${id}/results`)
      .query({ sort: 'vDi_ms:desc', filter: JSON.stringify({ Te_eV: { gte: 2, lte: 50 } }), pageSize: 4, page: 2 })
      .set(auth(tok.owner));
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(expected.length);
    expect(res.body.rows.map((r: { idx: number }) => r.idx)).toEqual(expected.slice(4, 8).map((r) => r.idx));
    expect(res.body.rows.map((r: { vDi_ms: number }) => r.vDi_ms)).toEqual(expected.slice(4, 8).map((r) => r.v));
    expect(res.body.columns.find((c: { name: string }) => c.name === 'vDi_ms')).toMatchObject({
      unit: 'm/s',
      kind: 'output',
    });
  });

  it('filters on validity', async () => {
    const id = ids.private;
    const [lo, hi] = span(id);
    const n = (
      t
        .sqlite()
        .prepare(`SELECT COUNT(*) AS n FROM results WHERE id BETWEEN ? AND ? AND ${slotOf(id, 'valid')} = 1`)
        .get(lo, hi) as { n: number }
    ).n;
    const yes = await t.http.get(`/api/sweeps/${id}/results`).query({ valid: 'true' }).set(auth(tok.owner));
    const no = await t.http.get(`/api/sweeps/${id}/results`).query({ valid: 'false' }).set(auth(tok.owner));
    expect(yes.body.total).toBe(n);
    expect(no.body.total).toBe(35 - n);
    expect(yes.body.rows.every((r: { valid: boolean }) => r.valid === true)).toBe(true);
  });

  it('answers injection attempts in sort and filter with 400 and changes nothing', async () => {
    const db = t.sqlite();
    const counts = () => ({
      results: (db.prepare('SELECT COUNT(*) AS n FROM results').get() as { n: number }).n,
      sweeps: (db.prepare('SELECT COUNT(*) AS n FROM sweeps').get() as { n: number }).n,
      users: (db.prepare('SELECT COUNT(*) AS n FROM users').get() as { n: number }).n,
    });
    const before = counts();
    const attempts: Record<string, string>[] = [
      { sort: 'vDi_ms; DROP TABLE results' },
      { sort: 'c0:asc' },
      { sort: '(SELECT 1)' },
      { sort: 'vDi_ms:desc, id' },
      { filter: '{"Te_eV) OR 1=1 --":{"gte":0}}' },
      { filter: '{"Te_eV":{"gte":"0 OR 1=1"}}' },
      { filter: '{"Te_eV":{"like":"%"}}' },
      { filter: '{"flags; DELETE FROM results":{"eq":1}}' },
      { filter: 'not json' },
    ];
    for (const query of attempts) {
      const res = await t.http.get(`/api/sweeps/${ids.private}/results`).query(query).set(auth(tok.owner));
      expect(res.status, JSON.stringify(query)).toBe(400);
    }
    const list = await t.http.get('/api/sweeps').query({ sort: 'name; DROP TABLE sweeps' }).set(auth(tok.owner));
    expect(list.status).toBe(400);
    expect(counts()).toEqual(before);
  });
});

describe('series', () => {
  it('draws one line per group from exact grid points, thinned to maxPoints', async () => {
    const res = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ x: 'Te_eV', y: 'vDi_ms', groupBy: 'B_T', maxPoints: 10 })
      .set(auth(tok.owner));
    expect(res.status).toBe(200);
    expect(res.body.method).toBe('grid-slice');
    expect(res.body.groups).toHaveLength(5);
    expect(res.body.returned).toBeLessThanOrEqual(10);
    for (const g of res.body.groups) {
      expect(g.points.length).toBeLessThanOrEqual(2);
      // Both ends of the Te axis are kept (1 eV and 100 eV).
      expect(g.points[0][0]).toBeCloseTo(1, 12);
      expect(g.points.at(-1)[0]).toBeCloseTo(100, 10);
    }
    expect(res.body.x).toMatchObject({ name: 'Te_eV', unit: 'eV', axisKind: 'log' });
    expect(res.body.y).toMatchObject({ name: 'vDi_ms', unit: 'm/s' });
  });

  it('holds the other swept inputs at a slice and checks the slice index', async () => {
    const ok = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ x: 'Te_eV', y: 'vDi_ms', 'slice.B_T': 4 })
      .set(auth(tok.owner));
    expect(ok.status).toBe(200);
    expect(ok.body.slice.B_T).toMatchObject({ index: 4, unit: 'T' });
    expect(ok.body.slice.B_T.value).toBeCloseTo(0.5, 12);
    expect(ok.body.groups[0].points).toHaveLength(7);
    const bad = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ x: 'Te_eV', y: 'vDi_ms', 'slice.B_T': 5 })
      .set(auth(tok.owner));
    expect(bad.status).toBe(400);
    expect(bad.body.details[0].path).toBe('slice.B_T');
    const notSwept = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ x: 'Te_eV', y: 'vDi_ms', 'slice.mu': 0 })
      .set(auth(tok.owner));
    expect(notSwept.status).toBe(400);
  });

  it('gives heatmap cells equal to the stored rows, flagged where a validity flag is raised', async () => {
    const id = ids.private;
    const res = await t.http
      .get(`/api/sweeps/${id}/series`)
      .query({ kind: 'heatmap', x: 'Te_eV', y: 'B_T', z: 'rho_i_over_Ln' })
      .set(auth(tok.owner));
    expect(res.status).toBe(200);
    expect(res.body.cells).toHaveLength(35);
    expect(res.body.x.values).toHaveLength(7);
    expect(res.body.y.values).toHaveLength(5);
    expect(res.body.z).toMatchObject({ name: 'rho_i_over_Ln', unit: '1' });
    const [lo] = span(id);
    const z = slotOf(id, 'rho_i_over_Ln');
    const stmt = t.sqlite().prepare(`SELECT ${z} AS z, flags FROM results WHERE id = ?`);
    let flagged = 0;
    for (const [xi, yi, value, bad] of res.body.cells) {
      // Grid order: Te (first axis) has stride 5, B stride 1 (last axis fastest).
      const row = stmt.get(lo + xi * 5 + yi) as { z: number; flags: number };
      expect(value).toBe(row.z);
      expect(bad).toBe((row.flags & res.body.invalidMask) !== 0 ? 1 : 0);
      flagged += bad;
    }
    const invalid = (t.sqlite().prepare('SELECT invalid_points AS n FROM sweeps WHERE id = ?').get(id) as { n: number })
      .n;
    expect(flagged).toBe(invalid);
    expect(res.body.flags.map((f: { code: string }) => f.code)).toContain('rho_i_over_Ln');
  });

  it('thins a heatmap to maxPoints cells and can average instead of slicing', async () => {
    const thin = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ kind: 'heatmap', x: 'Te_eV', y: 'B_T', z: 'beta', maxPoints: 12 })
      .set(auth(tok.owner));
    expect(thin.status).toBe(200);
    expect(thin.body.cells.length).toBeLessThanOrEqual(12);
    expect(thin.body.x.values[0]).toBeCloseTo(1, 12);
    expect(thin.body.x.values.at(-1)).toBeCloseTo(100, 10);
    const mean = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ kind: 'heatmap', x: 'Te_eV', y: 'B_T', z: 'beta', agg: 'mean' })
      .set(auth(tok.owner));
    expect(mean.body.method).toBe('grid-mean');
    // Two swept axes only: the mean over one point per cell is that point.
    const slice = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ kind: 'heatmap', x: 'Te_eV', y: 'B_T', z: 'beta' })
      .set(auth(tok.owner));
    for (let i = 0; i < slice.body.cells.length; i++)
      expect(mean.body.cells[i][2]).toBeCloseTo(slice.body.cells[i][2], 12);
  });

  it('rejects unknown columns, a heatmap without z and too large a budget', async () => {
    const q = (query: Record<string, string | number>) =>
      t.http.get(`/api/sweeps/${ids.private}/series`).query(query).set(auth(tok.owner));
    expect((await q({ x: 'Te_eV', y: 'nope' })).body.details[0].path).toBe('y');
    expect((await q({ kind: 'heatmap', x: 'Te_eV', y: 'B_T' })).body.details[0].path).toBe('z');
    expect((await q({ x: 'Te_eV', y: 'beta', maxPoints: 1e6 })).status).toBe(400);
    expect((await q({ x: 'Te_eV', y: 'flags' })).status).toBe(400);
  });

  it('takes strided samples when x is not a swept input', async () => {
    const res = await t.http
      .get(`/api/sweeps/${ids.private}/series`)
      .query({ x: 'vte_ms', y: 'vDi_ms', maxPoints: 8 })
      .set(auth(tok.owner));
    expect(res.status).toBe(200);
    expect(res.body.method).toBe('stride');
    expect(res.body.returned).toBeLessThanOrEqual(8);
    const xs = res.body.groups[0].points.map((p: number[]) => p[0]);
    expect(xs).toEqual([...xs].sort((a, b) => a - b));
  });
});

describe('sharing', () => {
  it('lets only the owner or an admin share, and checks the users', async () => {
    expect(
      (
        await t.http
          .put(`/api/sweeps/${ids.private}/sharing`)
          .set(auth(tok.other))
          .send({ visibility: 'group', userIds: [] })
      ).status,
    ).toBe(404);
    expect(
      (
        await t.http
          .put(`/api/sweeps/${ids.group}/sharing`)
          .set(auth(tok.other))
          .send({ visibility: 'private', userIds: [] })
      ).status,
    ).toBe(403);
    expect(
      (
        await t.http
          .put(`/api/sweeps/${ids.private}/sharing`)
          .set(auth(tok.reviewer))
          .send({ visibility: 'group', userIds: [] })
      ).status,
    ).toBe(403);
    const bad = await t.http
      .put(`/api/sweeps/${ids.private}/sharing`)
      .set(auth(tok.owner))
      .send({ visibility: 'private', userIds: [otherId, 99999] });
    expect(bad.status).toBe(400);
    expect(bad.body.details[0].path).toBe('userIds.1');
    expect(
      (
        await t.http
          .put(`/api/sweeps/${ids.archived}/sharing`)
          .set(auth(tok.owner))
          .send({ visibility: 'group', userIds: [] })
      ).status,
    ).toBe(409);
    const ok = await t.http
      .put(`/api/sweeps/${ids.private}/sharing`)
      .set(auth(tok.admin))
      .send({ visibility: 'private', userIds: [otherId] });
    expect(ok.status).toBe(200);
    expect((await t.http.get(`/api/sweeps/${ids.private}`).set(auth(tok.other))).status).toBe(200);
    await t.http
      .put(`/api/sweeps/${ids.private}/sharing`)
      .set(auth(tok.owner))
      .send({ visibility: 'private', userIds: [] });
    expect((await t.http.get(`/api/sweeps/${ids.private}`).set(auth(tok.other))).status).toBe(404);
  });

  it('offers a directory of names without e-mail addresses to those who can share', async () => {
    const res = await t.http.get('/api/users/directory').query({ q: 'Second' }).set(auth(tok.owner));
    expect(res.status).toBe(200);
    expect(res.body.items).toEqual([{ id: otherId, name: 'Second Researcher', role: 'researcher' }]);
    expect(JSON.stringify((await t.http.get('/api/users/directory').set(auth(tok.owner))).body)).not.toContain('@');
    expect((await t.http.get('/api/users/directory').set(auth(tok.reviewer))).status).toBe(403);
  });
});
