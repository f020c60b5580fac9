import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Papa from 'papaparse';
import { unzipSync, strFromU8 } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DatasetsService } from '../../api/src/datasets/datasets.service.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { binary } from '../support/binary.js';

const fixtures = path.join(path.dirname(fileURLToPath(import.meta.url)), '../fixtures/datasets');
const probeCsv = fs.readFileSync(path.join(fixtures, 'argon-probe-profile.csv'));
const driftCsv = fs.readFileSync(path.join(fixtures, 'drift-velocity-scan.csv'));

/** Relative difference, for unit conversions that go through floating point. */
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

let t: TestApp;
let researcher: string;
let reviewer: string;
let admin: string;

const auth = (token: string) => ({ authorization: `Bearer ${token}` });

function upload(token: string, csv: Buffer | string, fields: Record<string, string> = {}, fileName = 'scan.csv') {
  const req = t.http.post('/api/datasets').set(auth(token));
  for (const [k, v] of Object.entries(fields)) req.field(k, v);
  return req.attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv), fileName);
}

function storedCounts() {
  const db = t.sqlite();
  return {
    datasets: (db.prepare('SELECT COUNT(*) AS n FROM datasets').get() as { n: number }).n,
    rows: (db.prepare('SELECT COUNT(*) AS n FROM dataset_rows').get() as { n: number }).n,
  };
}

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  reviewer = await t.login(DEMO.reviewer);
  admin = await t.login(DEMO.admin);
});
afterAll(async () => t?.close());

describe('POST /api/datasets', () => {
  it('stores a probe profile with units converted to canonical SI', async () => {
    const res = await upload(
      researcher,
      probeCsv,
      { name: 'Argon probe scan', units: JSON.stringify({ r: 'cm', phi: 'V', n: 'cm^-3' }) },
      'argon-probe-profile.csv',
    );
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'Argon probe scan', rows: 13 });
    expect(res.body.columns).toEqual([
      { name: 'r', kind: 'number', unit: 'cm', canonicalUnit: 'm', quantity: 'length' },
      { name: 'phi', kind: 'number', unit: 'V', canonicalUnit: 'V', quantity: 'potential' },
      { name: 'n', kind: 'number', unit: 'cm^-3', canonicalUnit: 'm^-3', quantity: 'density' },
      { name: 'probe', kind: 'text', unit: '', canonicalUnit: '', quantity: null },
    ]);
    const id = res.body.id as number;
    const rows = t
      .sqlite()
      .prepare('SELECT id, cells FROM dataset_rows WHERE id BETWEEN ? AND ? ORDER BY id')
      .all(id * 2 ** 32, (id + 1) * 2 ** 32 - 1) as { id: number; cells: string }[];
    expect(rows).toHaveLength(13);
    expect(rows[0].id).toBe(id * 2 ** 32);
    // SI definitions: 1 cm = 1e-2 m, 1 cm^-3 = 1e6 m^-3 (exact).
    const last = JSON.parse(rows[12].cells);
    expect(rel(last[0], 0.06)).toBeLessThan(1e-12);
    expect(last[1]).toBe(-10.8);
    expect(rel(last[2], 2.73237e16)).toBeLessThan(1e-12);
    expect(last[3]).toBe('tip-B');

    const page = await t.http.get(`/api/datasets/${id}/rows?page=2&pageSize=5`).set(auth(researcher));
    expect(page.status).toBe(200);
    expect(page.body.total).toBe(13);
    expect(page.body.items.map((r: { row: number }) => r.row)).toEqual([5, 6, 7, 8, 9]);
    expect(page.body.items[0].cells[1]).toBe(-1.875);
  });

  it('keeps kelvin and gauss columns in eV and T', async () => {
    const res = await upload(researcher, 'Te,B\n11604.51812,1500\n23209.03624,2000\n', {
      units: JSON.stringify({ Te: 'K', B: 'G' }),
    });
    expect(res.status).toBe(201);
    expect(res.body.columns.map((c: { canonicalUnit: string }) => c.canonicalUnit)).toEqual(['eV', 'T']);
    const me = t.sqlite().prepare('SELECT id FROM users WHERE email = ?').get(DEMO.researcher) as { id: number };
    const cols = await t.app
      .get(DatasetsService)
      .columns(
        { id: me.id, email: DEMO.researcher, name: '', role: 'researcher', via: 'session', scope: 'read-write' },
        res.body.id,
        ['Te', 'B'],
      );
    // CODATA 2018: 1 eV ↔ 11604.51812 K (k_B and e exact); 1 G = 1e-4 T (NRL Plasma Formulary).
    expect(rel(cols.data.Te[0], 1)).toBeLessThan(1e-9);
    expect(rel(cols.data.Te[1], 2)).toBeLessThan(1e-9);
    expect(rel(cols.data.B[0], 0.15)).toBeLessThan(1e-12);
    expect(cols.n).toBe(2);
  });

  it('rejects an unknown unit naming the column, and stores nothing', async () => {
    const before = storedCounts();
    const res = await upload(researcher, probeCsv, { units: JSON.stringify({ r: 'cm', phi: 'volts-ish' }) });
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/phi/);
    expect(res.body.details).toEqual([expect.objectContaining({ column: 'phi', path: 'units.phi' })]);
    expect(storedCounts()).toEqual(before);
  });

  it('rejects units for a column the file does not have', async () => {
    const res = await upload(researcher, probeCsv, { units: JSON.stringify({ Te: 'eV' }) });
    expect(res.status).toBe(400);
    expect(res.body.details[0]).toMatchObject({ path: 'units.Te', column: 'Te' });
  });

  it('rejects a file without a header row', async () => {
    const res = await upload(researcher, '0,0,1e12\n0.5,-0.075,9.7e11\n');
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/header/);
    expect(res.body.details[0]).toMatchObject({ line: 1 });
  });

  it('reports ragged rows by line, and stores nothing', async () => {
    const before = storedCounts();
    const res = await upload(researcher, 'r,phi,n\n0,0,1e12\n0.5,-0.075\n1,-0.3,9e11,extra\n1.5,-0.675,8e11\n');
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([
      expect.objectContaining({ line: 3, message: expect.stringMatching(/2 fields; the header has 3/) }),
      expect.objectContaining({ line: 4, message: expect.stringMatching(/4 fields/) }),
    ]);
    expect(storedCounts()).toEqual(before);
  });

  it('reports non-numeric cells in a numeric column with line and column', async () => {
    const res = await upload(researcher, 'r,phi,n\n0,0,1e12\n0.5,-0.075,9.7e11\n1,oops,9e11\n1.5,-0.675,lots\n');
    expect(res.status).toBe(400);
    expect(res.body.details).toEqual([
      expect.objectContaining({ line: 4, column: 'phi', message: expect.stringMatching(/"oops" is not a number/) }),
      expect.objectContaining({ line: 5, column: 'n', message: expect.stringMatching(/"lots"/) }),
    ]);
  });

  it('caps the number of reported problems', async () => {
    const lines = ['x,y'];
    for (let i = 0; i < 120; i++) lines.push(i === 0 ? '1,2' : `${i},bad${i}`);
    const res = await upload(researcher, lines.join('\n'), { units: JSON.stringify({ y: 'V' }) });
    expect(res.status).toBe(400);
    expect(res.body.details).toHaveLength(50);
    expect(res.body.message).toMatch(/first 50 of 119/);
  });

  it('reports a quote that never closes', async () => {
    const res = await upload(researcher, 'a,b\n1,"open\n2,3\n');
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/not valid CSV/);
  });

  it('refuses a 25 MB upload with 413 naming the limit', async () => {
    const before = storedCounts();
    const big = Buffer.alloc(25 * 1024 * 1024, '1,2\n');
    const res = await upload(researcher, big);
    expect(res.status).toBe(413);
    expect(res.body.message).toMatch(/20 MB/);
    expect(res.body.message).toMatch(/UPLOAD_MAX_BYTES/);
    expect(storedCounts()).toEqual(before);
  });

  it('stores a formula-looking text cell verbatim and exports it neutralised', async () => {
    const evil = "=cmd|' /C calc'!A0";
    const csv = `B,note\n250,"${evil}"\n500,+SUM(A1:A2)\n750,-2+3\n1000,@evil\n1250,plain text\n`;
    const res = await upload(researcher, csv, { units: JSON.stringify({ B: 'G' }) });
    expect(res.status).toBe(201);
    const id = res.body.id;
    const stored = t
      .sqlite()
      .prepare('SELECT cells FROM dataset_rows WHERE id = ?')
      .get(id * 2 ** 32) as { cells: string };
    expect(JSON.parse(stored.cells)).toEqual([0.025, evil]);

    const zipRes = await t.http.get(`/api/datasets/${id}/export`).set(auth(researcher)).buffer(true).parse(binary);
    expect(zipRes.status).toBe(200);
    expect(zipRes.headers['content-type']).toBe('application/zip');
    const files = unzipSync(new Uint8Array(zipRes.body as Buffer));
    // Parsed with papaparse, a different CSV parser from the api's writer.
    const parsed = Papa.parse<string[]>(strFromU8(files['data.csv']), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    // OWASP CSV Injection advice: a leading ' keeps =, +, -, @ cells as text in spreadsheets.
    expect(parsed.data.slice(1).map((r) => r[1])).toEqual([
      `'${evil}`,
      "'+SUM(A1:A2)",
      "'-2+3",
      "'@evil",
      'plain text',
    ]);
    expect(parsed.data[1][0]).toBe('0.025');
    const manifest = JSON.parse(strFromU8(files['manifest.json']));
    expect(manifest.data.rows).toBe(5);
    expect(manifest.dataset.uploadSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(strFromU8(files['README.txt'])).toMatch(/CSV Injection/);
  });

  it('is closed to reviewers', async () => {
    const res = await upload(reviewer, probeCsv);
    expect(res.status).toBe(403);
  });

  it('needs a file', async () => {
    const res = await t.http.post('/api/datasets').set(auth(researcher)).field('name', 'nothing');
    expect(res.status).toBe(400);
    expect(res.body.details[0].path).toBe('file');
  });
});

describe('reading, sharing, deleting', () => {
  let id: number;

  beforeAll(async () => {
    const res = await upload(
      researcher,
      driftCsv,
      { name: 'Drift-velocity scan', units: JSON.stringify({ B: 'G', Er: 'V/m', vE: 'm/s' }) },
      'drift-velocity-scan.csv',
    );
    expect(res.status).toBe(201);
    id = res.body.id;
  });

  it('lists own datasets and hides private ones from others (404)', async () => {
    const mine = await t.http.get('/api/datasets?pageSize=100').set(auth(researcher));
    expect(mine.status).toBe(200);
    expect(mine.body).toMatchObject({ page: 1, pageSize: 100 });
    expect(mine.body.items.map((d: { id: number }) => d.id)).toContain(id);
    expect(mine.body.total).toBe(mine.body.items.length);
    const theirs = await t.http.get('/api/datasets').set(auth(reviewer));
    expect(theirs.body.items.map((d: { id: number }) => d.id)).not.toContain(id);
    expect((await t.http.get(`/api/datasets/${id}`).set(auth(reviewer))).status).toBe(404);
    expect((await t.http.get(`/api/datasets/${id}`).set(auth(admin))).status).toBe(200);
  });

  it('shares with a named user, then with the group', async () => {
    const reviewerId = (t.sqlite().prepare('SELECT id FROM users WHERE email = ?').get(DEMO.reviewer) as { id: number })
      .id;
    const bad = await t.http
      .put(`/api/datasets/${id}/sharing`)
      .set(auth(researcher))
      .send({ userIds: [reviewerId, 9999] });
    expect(bad.status).toBe(400);
    expect(bad.body.details[0].path).toBe('userIds.1');
    const shared = await t.http
      .put(`/api/datasets/${id}/sharing`)
      .set(auth(researcher))
      .send({ userIds: [reviewerId] });
    expect(shared.status).toBe(200);
    expect(shared.body.sharedWith).toEqual([reviewerId]);
    const seen = await t.http.get(`/api/datasets/${id}`).set(auth(reviewer));
    expect(seen.status).toBe(200);
    expect(seen.body.owner.name).toBeTruthy();
    expect(
      (await t.http.put(`/api/datasets/${id}/sharing`).set(auth(reviewer)).send({ visibility: 'group' })).status,
    ).toBe(403);
    await t.http
      .put(`/api/datasets/${id}/sharing`)
      .set(auth(researcher))
      .send({ userIds: [], visibility: 'group' })
      .expect(200);
    expect((await t.http.get(`/api/datasets/${id}/rows`).set(auth(reviewer))).status).toBe(200);
  });

  it('serves a series in canonical units for overlays', async () => {
    const res = await t.http.get(`/api/datasets/${id}/series?x=B&y=vE`).set(auth(reviewer));
    expect(res.status).toBe(200);
    expect(res.body.x).toEqual({ name: 'B', unit: 'T', quantity: 'magnetic field' });
    expect(res.body.y).toEqual({ name: 'vE', unit: 'm/s', quantity: 'velocity' });
    expect(res.body.n).toBe(8);
    // E×B speed v = E/B (textbook drift), 500 V/m over 0.025 T → 20,000 m/s.
    res.body.points.x.forEach((b: number, i: number) => expect(rel(res.body.points.y[i], 500 / b)).toBeLessThan(1e-12));
    const thin = await t.http.get(`/api/datasets/${id}/series?x=B&y=vE&maxPoints=3`).set(auth(reviewer));
    expect(thin.body.n).toBeLessThanOrEqual(3);
    expect(thin.body.total).toBe(8);
    const text = await t.http.get(`/api/datasets/${id}/series?x=B&y=note`).set(auth(reviewer));
    expect(text.status).toBe(400);
    expect(text.body.message).toMatch(/text/);
    const unknown = await t.http.get(`/api/datasets/${id}/series?x=B&y=Te`).set(auth(reviewer));
    expect(unknown.status).toBe(400);
  });

  it('deletes for the owner only', async () => {
    expect((await t.http.delete(`/api/datasets/${id}`).set(auth(reviewer))).status).toBe(403);
    expect((await t.http.delete(`/api/datasets/${id}`).set(auth(researcher))).status).toBe(204);
    expect((await t.http.get(`/api/datasets/${id}`).set(auth(researcher))).status).toBe(404);
    const left = t
      .sqlite()
      .prepare('SELECT COUNT(*) AS n FROM dataset_rows WHERE id BETWEEN ? AND ?')
      .get(id * 2 ** 32, (id + 1) * 2 ** 32 - 1) as { n: number };
    expect(left.n).toBe(0);
  });
});
