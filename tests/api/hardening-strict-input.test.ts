/**
 * Issue 14 §2.7: strict bodies and filters. A non-JSON body on a JSON route is 415; a filter on
 * `__proto__` is an unknown column like any other; list routes refuse query parameters they do
 * not know; unknown keys inside sweep axes, sampling and derived columns are refused, not stored.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let researcher: string;
let sweepId: number;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });
const sweepCount = () => (t.sqlite().prepare('SELECT COUNT(*) AS n FROM sweeps').get() as { n: number }).n;

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  const s = await t.http.post('/api/sweeps').set(auth(researcher)).send(smallSweep());
  expect(s.status).toBe(201);
  sweepId = s.body.id;
  await waitForSweep(t, researcher, sweepId);
});
afterAll(async () => t?.close());

describe('a body that is not JSON on a JSON route', () => {
  it.each([
    ['text/plain', JSON.stringify(smallSweep())],
    ['application/x-www-form-urlencoded', 'name=x&model=cross-field'],
    ['application/xml', '<sweep/>'],
  ])('%s gets 415 and stores nothing', async (type, body) => {
    const before = sweepCount();
    const res = await t.http.post('/api/sweeps').set(auth(researcher)).set('content-type', type).send(body);
    expect(res.status).toBe(415);
    expect(res.body.message).toMatch(/application\/json/);
    expect(sweepCount()).toBe(before);
  });

  it('also on sign-in, where the body is a password', async () => {
    const res = await t.http
      .post('/api/auth/login')
      .set('content-type', 'text/plain')
      .send(JSON.stringify({ email: DEMO.researcher, password: 'driftgrid-demo' }));
    expect(res.status).toBe(415);
  });

  it('JSON with a charset, and bodiless POSTs, still work', async () => {
    const ok = await t.http
      .post('/api/sweeps/preview')
      .set(auth(researcher))
      .set('content-type', 'application/json; charset=utf-8')
      .send(JSON.stringify(smallSweep()));
    expect(ok.status).toBe(200);
    const s = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ name: 'to cancel' }));
    const cancel = await t.http.post(`/api/sweeps/${s.body.id}/cancel`).set(auth(researcher));
    expect([200, 409]).toContain(cancel.status);
  });
});

describe('filters on prototype names', () => {
  it.each(['__proto__', 'constructor', 'toString'])('%s is an unknown column (400 naming it)', async (name) => {
    const unknown = await t.http
      .get(`/api/sweeps/${sweepId}/results`)
      .set(auth(researcher))
      .query({ filter: JSON.stringify({ nosuch: { gte: 1 } }) });
    expect(unknown.status).toBe(400);
    const res = await t.http
      .get(`/api/sweeps/${sweepId}/results`)
      .set(auth(researcher))
      .query({ filter: `{"${name}":{"gte":1}}` });
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe(`filter.${name}`);
    expect(res.body.details[0].message).toBe(unknown.body.details[0].message);
  });
});

describe('list routes refuse unknown query parameters', () => {
  it.each([
    ['/api/sweeps', { pageSize: 5, colour: 'red' }, 'colour'],
    ['/api/tokens', { page: 1, sortBy: 'name' }, 'sortBy'],
    ['/api/datasets', { q: 'argon', limit: 3 }, 'limit'],
    ['/api/fits', { offset: 10 }, 'offset'],
    ['RESULTS', { pageSize: 5, where: '1=1' }, 'where'],
  ])('%s with %j names %s', async (route, query, name) => {
    const url = route === 'RESULTS' ? `/api/sweeps/${sweepId}/results` : route;
    const res = await t.http.get(url).set(auth(researcher)).query(query);
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([expect.objectContaining({ path: name })]);
    expect(res.body.message).toMatch(new RegExp(`unknown query parameter.*${name}|${name}.*unknown query parameter`));
  });

  it('known parameters still pass', async () => {
    expect((await t.http.get('/api/sweeps').set(auth(researcher)).query({ pageSize: 5, page: 1 })).status).toBe(200);
  });
});

describe('unknown keys inside a sweep definition', () => {
  const cases: [string, Record<string, unknown>, string][] = [
    [
      'an axis',
      {
        axes: [
          { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 7, note: 'x'.repeat(1000) },
          { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 5 },
        ],
      },
      'axes.0.note',
    ],
    [
      'a list axis',
      {
        axes: [
          { param: 'Te_eV', kind: 'list', values: [1, 2], step: 3 },
          { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 5 },
        ],
      },
      'axes.0.step',
    ],
    ['the sampling', { sampling: { kind: 'grid', shuffle: true } }, 'sampling.shuffle'],
    ['a derived column', { derived: [{ name: 'ratio', expr: 'Te_eV / 2', colour: 'red' }] }, 'derived.0.colour'],
  ];
  it.each(cases)('in %s: 400 naming the key, nothing stored', async (_where, override, path) => {
    const before = sweepCount();
    const res = await t.http.post('/api/sweeps').set(auth(researcher)).send(smallSweep(override));
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual(expect.arrayContaining([expect.objectContaining({ path })]));
    expect(sweepCount()).toBe(before);
    const preview = await t.http.post('/api/sweeps/preview').set(auth(researcher)).send(smallSweep(override));
    expect(preview.body.ok).toBe(false);
    expect(preview.body.errors).toEqual(expect.arrayContaining([expect.objectContaining({ path })]));
  });
});
