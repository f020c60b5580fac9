/**
 * Issue 14 §2.6 (values): derived values of +∞, −∞ and NaN stay distinguishable in the results api
 * (JSON has no such numbers: they are answered as the strings "Infinity", "-Infinity" and "NaN")
 * and in the CSV export (the same words), instead of all becoming null or an empty cell.
 * IEEE 754: x/0 is ±∞ by the sign of x, 0/0 is NaN.
 */
import { strFromU8, unzipSync } from 'fflate';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { binary } from '../support/binary.js';
import { NON_FINITE_DERIVED, smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let researcher: string;
let id: number;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  const s = await t.http
    .post('/api/sweeps')
    .set(auth(researcher))
    .send(
      smallSweep({
        derived: NON_FINITE_DERIVED,
      }),
    );
  expect(s.status, JSON.stringify(s.body)).toBe(201);
  id = s.body.id;
  const done = await waitForSweep(t, researcher, id);
  expect(done.status).toBe('completed');
});
afterAll(async () => t?.close());

describe('non-finite derived values', () => {
  it('the results api answers "Infinity", "-Infinity" and "NaN"', async () => {
    const res = await t.http.get(`/api/sweeps/${id}/results`).set(auth(researcher)).query({ pageSize: 5 });
    expect(res.status).toBe(200);
    for (const row of res.body.items ?? res.body.rows) {
      expect(row.up).toBe('Infinity');
      expect(row.down).toBe('-Infinity');
      expect(row.undef).toBe('NaN');
      expect(typeof row.finite).toBe('number');
    }
  });

  it('a range filter sees +∞ above every finite value', async () => {
    const res = await t.http
      .get(`/api/sweeps/${id}/results`)
      .set(auth(researcher))
      .query({ pageSize: 1, filter: JSON.stringify({ up: { gt: 1e300 } }) });
    expect(res.status).toBe(200);
    expect(res.body.total).toBe(35);
  });

  it('the CSV export writes Infinity, -Infinity and NaN', async () => {
    const res = await t.http.get(`/api/sweeps/${id}/export`).set(auth(researcher)).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    const zip = unzipSync(new Uint8Array(res.body as Buffer));
    const rows = Papa.parse<Record<string, string>>(strFromU8(zip['results.csv']!).trim(), { header: true }).data;
    expect(rows).toHaveLength(35);
    for (const r of rows) {
      expect(r.up).toBe('Infinity');
      expect(r.down).toBe('-Infinity');
      expect(r.undef).toBe('NaN');
      expect(Number.isFinite(Number(r.finite))).toBe(true);
    }
  });
});
