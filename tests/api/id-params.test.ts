import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

/*
 * Every numeric `{id}` path parameter goes through the one IdParamPipe (api/src/common): a record id
 * is a positive whole number, so -1, 0, 1.5, 1e3 and words answer 400 naming the parameter before any
 * service runs. The routes come from the running app's OpenAPI document, so a new `:id` route that
 * forgets the pipe (e.g. Nest's ParseIntPipe, which accepts -1) fails here.
 */

/** Routes whose `{id}` is not a record number: model ids are names such as `exb-drift`. */
const NAMED_IDS = /^\/api\/models\//;
const BAD_IDS = ['-1', '0', '1.5', '1e3', 'abc', '99999999999999999999'];
/**
 * A well-formed query and body for routes that validate them too, so a refusal can only come from
 * the id (Nest may run the query/body pipes before the path pipe).
 */
const WELL_FORMED: Record<string, { query?: Record<string, string>; body?: object }> = {
  'GET /api/sweeps/{id}/series': { query: { x: 'Te_eV', y: 'v_ExB_m_s' } },
  'GET /api/datasets/{id}/series': { query: { x: 'r', y: 'phi' } },
  'GET /api/sweeps/{id}/sensitivity': { query: { output: 'v_ExB_m_s' } },
  'PUT /api/sweeps/{id}/sharing': { body: { visibility: 'private' } },
  'PUT /api/datasets/{id}/sharing': { body: { visibility: 'private' } },
  'PATCH /api/admin/users/{id}': { body: { active: true } },
};

let t: TestApp;
let token = '';
let routes: { method: string; path: string }[] = [];

beforeAll(async () => {
  t = await startTestApp();
  token = await t.login(DEMO.admin);
  const doc = await t.http.get('/api/docs/openapi.json');
  expect(doc.status).toBe(200);
  routes = Object.entries(doc.body.paths as Record<string, Record<string, unknown>>)
    .filter(([p]) => p.includes('{id}') && !NAMED_IDS.test(p))
    .flatMap(([path, ops]) => Object.keys(ops).map((method) => ({ method, path })));
});

afterAll(async () => {
  await t?.close();
});

describe('numeric id path parameters', () => {
  it('covers the sweeps, fits, catalogue, datasets and admin routes', () => {
    const paths = routes.map((r) => `${r.method.toUpperCase()} ${r.path}`);
    // A floor, not the full list: these were the ParseIntPipe routes before and must stay covered.
    for (const p of [
      'GET /api/sweeps/{id}',
      'POST /api/sweeps/{id}/cancel',
      'DELETE /api/sweeps/{id}',
      'GET /api/fits/{id}',
      'PUT /api/sweeps/{id}/sharing',
      'GET /api/sweeps/{id}/results',
      'GET /api/datasets/{id}',
      'PATCH /api/admin/users/{id}',
    ])
      expect(paths).toContain(p);
  });

  it('answers 400 naming the parameter for a negative, zero, fractional, exponent, word or oversized id', async () => {
    const failures: string[] = [];
    for (const { method, path } of routes) {
      for (const bad of BAD_IDS) {
        const url = path.replace('{id}', encodeURIComponent(bad));
        const m = method as 'get' | 'post' | 'put' | 'patch' | 'delete';
        const extra = WELL_FORMED[`${method.toUpperCase()} ${path}`] ?? {};
        const res = await t.http[m](url)
          .query(extra.query ?? {})
          .set({ authorization: `Bearer ${token}` })
          .send(extra.body ?? {});
        const body = res.body as { message?: string; details?: { path: string; message: string }[] };
        const named = body.details?.some((d) => d.path === 'id' && /positive whole number/.test(d.message)) ?? false;
        if (res.status !== 400 || !named || !/\bid\b/.test(body.message ?? ''))
          failures.push(`${method.toUpperCase()} ${url} → ${res.status} ${JSON.stringify(res.body)}`);
      }
    }
    expect(failures).toEqual([]);
  });

  it('passes a well-formed id on to the route (an unknown one is 404, not 400)', async () => {
    const res = await t.http.get('/api/sweeps/987654').set({ authorization: `Bearer ${token}` });
    expect(res.status).toBe(404);
  });
});
