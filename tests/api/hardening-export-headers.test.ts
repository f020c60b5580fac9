/**
 * Issue 14 §2.5: columns.csv in the dataset export gets the same formula guard as the data file
 * (OWASP "CSV Injection": a cell starting with =, +, -, @, tab or CR is prefixed with ').
 */
import { strFromU8, unzipSync } from 'fflate';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';
import { binary } from '../support/binary.js';

let t: TestApp;
let researcher: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

/** supertest parser that keeps a binary body as a Buffer. */
beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
});
afterAll(async () => t?.close());

describe('dataset export: header names are guarded everywhere', () => {
  it('columns.csv neutralises formula-looking names like data.csv does', async () => {
    // (Header names are trimmed on upload, so a leading tab or CR cannot survive to the export.)
    const names = ['=HYPERLINK("http://x")', '@SUM(A1)', '+n', '-phi', 'plain'];
    const header = names.map((n) => `"${n.replace(/"/g, '""')}"`).join(',');
    const up = await t.http
      .post('/api/datasets')
      .set(auth(researcher))
      .field('name', 'argon probe header guard')
      .attach('file', Buffer.from(`${header}\n1,2,3,4,5\n7,8,9,10,11\n`), 'guard.csv');
    expect(up.status).toBe(201);
    const res = await t.http.get(`/api/datasets/${up.body.id}/export`).set(auth(researcher)).buffer(true).parse(binary);
    expect(res.status).toBe(200);
    const zip = unzipSync(new Uint8Array(res.body as Buffer));
    const data = Papa.parse<string[]>(strFromU8(zip['data.csv']!).trim()).data;
    const cols = Papa.parse<string[]>(strFromU8(zip['columns.csv']!).trim()).data;
    const guarded = names.map((n) => (/^[=+\-@\t\r]/.test(n) ? `'${n}` : n));
    expect(data[0]).toEqual(guarded);
    expect(cols[0]).toEqual(['name', 'kind', 'unit', 'uploaded_unit', 'quantity']);
    expect(cols.slice(1).map((r) => r[0])).toEqual(guarded);
    // No cell of columns.csv starts a formula.
    for (const row of cols) for (const cell of row) expect(cell).not.toMatch(/^[=+\-@\t\r]/);
  });
});
