import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import Papa from 'papaparse';
import { strFromU8, unzipSync } from 'fflate';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { binary } from '../support/binary.js';
import { smallSweep, waitForSweep } from '../support/sweeps.js';

let t: TestApp;
let researcher: string;
let reviewer: string;
let admin: string;
let sweepId: number;

const auth = (token: string) => ({ authorization: `Bearer ${token}` });
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** supertest parser that keeps a binary body as a Buffer. */
async function download(id: number, token: string) {
  const res = await t.http.get(`/api/sweeps/${id}/export`).set(auth(token)).buffer(true).parse(binary);
  return { res, body: res.body as Buffer };
}

interface StoredColumn {
  name: string;
  kind: string;
  type: string;
  slot: string;
}

/** The sweep's rows straight from SQLite, in index order, under their column names. */
function dbRows(id: number): { columns: StoredColumn[]; rows: (number | null)[][] } {
  const db = t.sqlite();
  const s = db.prepare('SELECT columns FROM sweeps WHERE id = ?').get(id) as { columns: string };
  const columns = JSON.parse(s.columns) as StoredColumn[];
  const sel = columns.map((c) => (c.kind === 'index' ? `id - ${id * 2 ** 32}` : c.slot)).join(', ');
  const rows = db
    .prepare(`SELECT ${sel} FROM results WHERE id BETWEEN ? AND ? ORDER BY id`)
    .raw(true)
    .all(id * 2 ** 32, (id + 1) * 2 ** 32 - 1) as (number | null)[][];
  return { columns, rows };
}

function insertFit(id: number, model: string, result: unknown) {
  const owner = (t.sqlite().prepare('SELECT id FROM users WHERE email = ?').get(DEMO.researcher) as { id: number }).id;
  t.sqlite()
    .prepare(
      `INSERT INTO fits (owner_id, source_kind, source_id, model, request, result, status, progress, app_version, created_at, finished_at)
    VALUES (?, 'sweep', ?, ?, ?, ?, 'completed', 1, '0.1.0', ?, ?)`,
    )
    .run(
      owner,
      id,
      model,
      JSON.stringify({ source: { kind: 'sweep', id }, model, y: 'vDi_ms', x: ['Te_eV', 'B_T'] }),
      JSON.stringify(result),
      Date.now(),
      Date.now(),
    );
}

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
  reviewer = await t.login(DEMO.reviewer);
  admin = await t.login(DEMO.admin);
  const created = await t.http
    .post('/api/sweeps')
    .set(auth(researcher))
    .send(smallSweep({ name: 'Argon column / export check' }));
  expect(created.status).toBe(201);
  sweepId = created.body.id;
  const done = await waitForSweep(t, researcher, sweepId);
  expect(done.status).toBe('completed');
});
afterAll(async () => t?.close());

describe('GET /api/sweeps/:id/export', () => {
  it('round-trips every value through results.csv (read back with papaparse)', async () => {
    insertFit(sweepId, 'power-law', { parameters: [{ name: 'C', value: 1.5, stdError: 0.1 }] });
    const { res, body } = await download(sweepId, researcher);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/zip');
    expect(res.headers['content-disposition']).toBe(`attachment; filename="argon-column-export-check-${sweepId}.zip"`);
    const files = unzipSync(new Uint8Array(body));
    expect(Object.keys(files)).toEqual(['results.csv', 'columns.csv', 'README.txt', 'manifest.json']);

    const parsed = Papa.parse<string[]>(strFromU8(files['results.csv']), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...lines] = parsed.data;
    const { columns, rows } = dbRows(sweepId);
    expect(header).toEqual(columns.map((c) => c.name));
    expect(lines).toHaveLength(35);
    expect(rows).toHaveLength(35);
    let compared = 0;
    rows.forEach((dbRow, i) => {
      dbRow.forEach((v, j) => {
        const cell = lines[i][j];
        if (v === null) expect(cell).toBe('');
        else if (columns[j].type === 'boolean') expect(cell).toBe(v === 1 ? 'true' : 'false');
        else expect(Number(cell)).toBe(v); // exact: the shortest round-trip text reads back to the same double
        compared++;
      });
    });
    expect(compared).toBe(35 * columns.length);

    const manifest = JSON.parse(strFromU8(files['manifest.json']));
    expect(manifest.results.rows).toBe(35);
    expect(manifest.results.sha256).toBe(sha256(files['results.csv']));
    expect(manifest.results.bytes).toBe(files['results.csv'].length);
    expect(manifest.model).toMatchObject({ id: 'cross-field' });
    expect(manifest.model.version).toMatch(/^\d+\.\d+\.\d+/);
    expect(manifest.owner.name).toBeTruthy();
    expect(manifest.definition).toEqual(smallSweep({ name: 'Argon column / export check' }));
    expect(manifest.times.finishedAt).toBeTruthy();
    expect(manifest.times.archivedAt).toBeNull();
    expect(manifest.fits).toHaveLength(1);
    expect(manifest.fits[0]).toMatchObject({
      model: 'power-law',
      request: { y: 'vDi_ms' },
      result: { parameters: [{ name: 'C' }] },
    });
    expect(manifest.flags.map((f: { code: string }) => f.code)).toContain('rho_i_over_Ln');

    const cols = Papa.parse<string[]>(strFromU8(files['columns.csv']), { skipEmptyLines: true }).data;
    expect(cols[0]).toEqual(['name', 'unit', 'meaning']);
    expect(cols.slice(1).map((c) => c[0])).toEqual(columns.map((c) => c.name));
    expect(cols.find((c) => c[0] === 'Te_eV')![1]).toBe('eV');

    const readme = strFromU8(files['README.txt']);
    expect(readme).toMatch(/rho_i_over_Ln/);
    expect(readme).toMatch(/reduced fluid models with stated validity limits/);
    expect(readme).toMatch(/local codes and licensed practice/);
    expect(readme).toMatch(/Te_eV/);
  });

  it('is readable by whoever may read the sweep, and 404 for others', async () => {
    expect((await download(sweepId, admin)).res.status).toBe(200);
    expect((await download(sweepId, reviewer)).res.status).toBe(404);
    expect((await download(999999, researcher)).res.status).toBe(404);
    expect((await t.http.get(`/api/sweeps/${sweepId}/export`)).status).toBe(401);
  });
});

describe('POST /api/sweeps/:id/archive', () => {
  it('refuses reviewers and sweeps that are not completed', async () => {
    expect((await t.http.post(`/api/sweeps/${sweepId}/archive`).set(auth(reviewer))).status).toBe(403);
    const other = await t.http
      .post('/api/sweeps')
      .set(auth(researcher))
      .send(smallSweep({ name: 'not finished' }));
    await waitForSweep(t, researcher, other.body.id);
    for (const status of ['failed', 'cancelled', 'running']) {
      // Put the sweep in each state directly: the archive route must refuse all but completed.
      t.sqlite().prepare('UPDATE sweeps SET status = ? WHERE id = ?').run(status, other.body.id);
      const res = await t.http.post(`/api/sweeps/${other.body.id}/archive`).set(auth(researcher));
      expect(res.status).toBe(409);
      expect(res.body.message).toMatch(new RegExp(`is ${status}; only completed sweeps can be archived`));
    }
  });

  it('freezes the export: byte-identical downloads whose SHA-256 is archive.sha256', async () => {
    const res = await t.http.post(`/api/sweeps/${sweepId}/archive`).set(auth(researcher));
    expect(res.status).toBe(200);
    expect(res.body.status).toBe('archived');
    const { sha256: sha, bytes } = res.body.archive;
    expect(sha).toMatch(/^[0-9a-f]{64}$/);

    const row = t
      .sqlite()
      .prepare('SELECT archive_file, archive_bytes, archived_at FROM sweeps WHERE id = ?')
      .get(sweepId) as { archive_file: string; archive_bytes: number; archived_at: number };
    expect(row.archive_file).toBe(`sweep-${sweepId}-${sha.slice(0, 12)}.zip`);
    const onDisk = fs.readFileSync(path.join(t.config.archiveDir, row.archive_file));
    expect(sha256(onDisk)).toBe(sha);
    expect(onDisk.length).toBe(bytes);
    expect(fs.readdirSync(t.config.archiveDir).filter((f) => f.endsWith('.part'))).toEqual([]);

    // A fit attached after archiving does not change the frozen zip.
    insertFit(sweepId, 'exponential', { parameters: [{ name: 'A', value: 2, stdError: 0.2 }] });

    const a = await download(sweepId, researcher);
    const b = await download(sweepId, reviewer); // archived sweeps are visible to every signed-in user
    expect(a.res.status).toBe(200);
    expect(b.res.status).toBe(200);
    expect(Buffer.compare(a.body, b.body)).toBe(0);
    expect(Buffer.compare(a.body, onDisk)).toBe(0);
    expect(sha256(a.body)).toBe(sha);
    expect(a.res.headers['x-archive-sha256']).toBe(sha);
    expect(a.res.headers.etag).toBe(`"${sha}"`);
    expect(Number(a.res.headers['content-length'])).toBe(bytes);

    const files = unzipSync(new Uint8Array(a.body));
    const manifest = JSON.parse(strFromU8(files['manifest.json']));
    expect(manifest.sweep.status).toBe('archived');
    expect(manifest.times.archivedAt).toBe(new Date(row.archived_at).toISOString());
    expect(manifest.results.sha256).toBe(sha256(files['results.csv']));
    expect(manifest.fits.map((f: { model: string }) => f.model)).toEqual(['power-law']);
    expect(strFromU8(files['README.txt'])).toMatch(/frozen archive/);

    const cached = await t.http
      .get(`/api/sweeps/${sweepId}/export`)
      .set(auth(reviewer))
      .set('if-none-match', `"${sha}"`);
    expect(cached.status).toBe(304);
  });

  it('is immutable afterwards: archiving again and deleting are 409', async () => {
    expect((await t.http.post(`/api/sweeps/${sweepId}/archive`).set(auth(researcher))).status).toBe(409);
    expect((await t.http.delete(`/api/sweeps/${sweepId}`).set(auth(admin))).status).toBe(409);
    const s = await t.http.get(`/api/sweeps/${sweepId}`).set(auth(reviewer));
    expect(s.body.archive.sha256).toMatch(/^[0-9a-f]{64}$/);
  });
});
