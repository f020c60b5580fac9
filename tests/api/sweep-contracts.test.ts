/**
 * Issue 16 §3: the sweep and results responses are declared once, as zod schemas in the domain's
 * contracts, and the ui reads them through those types. This parses real answers of a running app with
 * those schemas in strict mode: a key the api adds, drops or renames without the contract fails here.
 * Every path that builds a results page is covered (a rowid range, a sorted page on the read pool,
 * the same page from the cached order, a filter), and the archived shape with its digest.
 */
import { resultsPageSchema, sweepViewSchema, type ResultsPage } from '@driftgrid/domain';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { NON_FINITE_DERIVED, smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let researcher: string;
let id: number;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

/** Parses strictly and reports every offending path (zod's own message names them). */
function strict<T>(schema: z.ZodType<T>, v: unknown): T {
  const r = schema.safeParse(v);
  if (!r.success) throw new Error(`${r.error.message}\n${JSON.stringify(v).slice(0, 2000)}`);
  return r.data;
}

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  const s = await t.http
    .post('/api/sweeps')
    .set(auth(researcher))
    .send(
      smallSweep({
        name: 'Argon column contract scan',
        derived: NON_FINITE_DERIVED,
      }),
    );
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  id = s.body.id;
  const done = await waitForSweep(t, researcher, id);
  expect(done.status).toBe('completed');
});
afterAll(async () => t?.close());

describe('GET /api/sweeps/:id against the domain sweepViewSchema', () => {
  it('parses strictly, and the schema refuses an extra or a missing key', async () => {
    const res = await t.http.get(`/api/sweeps/${id}`).set(auth(researcher));
    expect(res.status).toBe(200);
    const v = strict(sweepViewSchema, res.body);
    expect(v.status).toBe('completed');
    expect(v.definition.name).toBe('Argon column contract scan');
    expect(v.columns.map((c) => c.name)).toEqual(expect.arrayContaining(['idx', 'Te_eV', 'up', 'valid', 'flags']));
    expect(v.columns.every((c) => !('slot' in c))).toBe(true);
    // The schema is really strict (so the parse above proves the shape, not just some of it).
    expect(sweepViewSchema.safeParse({ ...res.body, slotMap: {} }).success).toBe(false);
    const { provenance: _p, ...missing } = res.body as Record<string, unknown>;
    expect(sweepViewSchema.safeParse(missing).success).toBe(false);
    expect(sweepViewSchema.safeParse({ ...res.body, columns: [{ ...v.columns[0], slot: 'c0' }] }).success).toBe(false);
  });
});

describe('GET /api/sweeps/:id/results against the domain resultsPageSchema', () => {
  const get = async (query: Record<string, string | number>): Promise<ResultsPage> => {
    const res = await t.http.get(`/api/sweeps/${id}/results`).set(auth(researcher)).query(query);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    return strict(resultsPageSchema, res.body);
  };

  it('an index-order page (a rowid range) carries the non-finite strings and booleans', async () => {
    const p = await get({ pageSize: 10 });
    expect(p.total).toBe(35);
    expect(p.rows).toHaveLength(10);
    for (const r of p.rows) {
      expect([r.up, r.down, r.undef]).toEqual(['Infinity', '-Infinity', 'NaN']);
      expect(typeof r.valid).toBe('boolean');
      expect(typeof r.finite).toBe('number');
    }
  });

  it('the column list is the same one function of the layout as on the sweep', async () => {
    const sweep = strict(sweepViewSchema, (await t.http.get(`/api/sweeps/${id}`).set(auth(researcher))).body);
    const p = await get({ pageSize: 1 });
    expect(p.columns).toEqual(sweep.columns);
  });

  it('a sorted page (read pool), the same page again (cached order) and a filtered page parse too', async () => {
    const sorted = await get({ pageSize: 7, page: 2, sort: 'B_T:desc' });
    expect(sorted.rows).toHaveLength(7);
    const again = await get({ pageSize: 7, page: 2, sort: 'B_T:desc' });
    expect(again.rows.map((r) => r.idx)).toEqual(sorted.rows.map((r) => r.idx));
    const filtered = await get({ filter: JSON.stringify({ Te_eV: { gte: 10 } }), sort: 'Te_eV:asc' });
    expect(filtered.total).toBeGreaterThan(0);
    expect(filtered.rows.every((r) => typeof r.Te_eV === 'number' && r.Te_eV >= 10)).toBe(true);
  });

  it('the schema refuses a cell that is not a number, boolean, non-finite word or null', () => {
    const ok = { rows: [{ idx: 0, up: 'Infinity' }], total: 1, columns: [] };
    expect(resultsPageSchema.safeParse(ok).success).toBe(true);
    expect(resultsPageSchema.safeParse({ ...ok, rows: [{ idx: 0, up: 'inf' }] }).success).toBe(false);
    expect(resultsPageSchema.safeParse({ ...ok, next: 2 }).success).toBe(false);
  });
});

describe('an archived sweep', () => {
  it('answers the archive digest inside the same strict shape', async () => {
    const res = await t.http.post(`/api/sweeps/${id}/archive`).set(auth(researcher));
    expect(res.status, JSON.stringify(res.body)).toBeLessThan(300);
    const v = strict(sweepViewSchema, res.body);
    expect(v.status).toBe('archived');
    expect(v.archive?.sha256).toMatch(/^[0-9a-f]{64}$/);
    strict(sweepViewSchema, (await t.http.get(`/api/sweeps/${id}`).set(auth(researcher))).body);
  });
});
