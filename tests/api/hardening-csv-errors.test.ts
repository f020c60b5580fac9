/**
 * Issue 14 §2.2: every error csv-parse can raise becomes a 400 naming the line, in the user's words
 * (never a 500, never the library's code). The codes are read from csv-parse's own source, so a new
 * code in a later release fails here until it has wording.
 */
import fs from 'node:fs';
import path from 'node:path';
import { createRequire } from 'node:module';
import { CsvError } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ValidationError } from '@driftgrid/domain';
import { csvParseFailure, CSV_PARSE_CODES, MAX_RECORD_BYTES } from '../../api/src/datasets/csv-parse-errors.js';
import { DEMO, startTestApp, type TestApp } from '../support/app.js';

/** Every code csv-parse constructs a CsvError with, from its installed source. */
function codesInCsvParseSource(): string[] {
  const require = createRequire(path.resolve('api/package.json'));
  let root = path.dirname(require.resolve('csv-parse/sync'));
  while (path.basename(root) !== 'csv-parse') root = path.dirname(root);
  const lib = path.join(root, 'lib');
  const codes = new Set<string>();
  const walk = (dir: string) => {
    for (const f of fs.readdirSync(dir, { withFileTypes: true })) {
      const p = path.join(dir, f.name);
      if (f.isDirectory()) walk(p);
      else if (p.endsWith('.js'))
        for (const m of fs.readFileSync(p, 'utf8').matchAll(/new CsvError\(\s*["']([A-Z_]+)["']/g)) codes.add(m[1]!);
    }
  };
  walk(lib);
  return [...codes].sort();
}

let t: TestApp;
let researcher: string;
const auth = (token: string) => ({ authorization: `Bearer ${token}` });
const upload = (csv: string | Buffer) =>
  t.http
    .post('/api/datasets')
    .set(auth(researcher))
    .field('name', 'argon probe trace')
    .attach('file', Buffer.isBuffer(csv) ? csv : Buffer.from(csv), 'trace.csv');

beforeAll(async () => {
  t = await startTestApp();
  researcher = await t.login(DEMO.researcher);
});
afterAll(async () => t?.close());

describe('csv-parse error codes', () => {
  const codes = codesInCsvParseSource();

  it('finds the codes in csv-parse and has wording for each of them', () => {
    expect(codes.length).toBeGreaterThan(15);
    expect(codes).toContain('INVALID_OPENING_QUOTE');
    expect([...CSV_PARSE_CODES].sort()).toEqual(codes);
  });

  it.each(codes)('%s becomes a ValidationError (400) with the line, without the code', (code) => {
    const err = new CsvError(code as never, 'Library words: something failed at line 7', {} as never, {
      lines: 7,
      column: 2,
      record: ['1', '2', '3'],
    });
    const v = csvParseFailure(err);
    expect(v).toBeInstanceOf(ValidationError);
    expect(v!.message).toMatch(/line 7/);
    expect(v!.message).not.toContain(code);
    expect(v!.message).not.toMatch(/Library words/);
    expect(v!.details).toEqual([expect.objectContaining({ path: 'file', line: 7 })]);
  });

  it('leaves errors that are not from the parser alone', () => {
    expect(csvParseFailure(new TypeError('x'))).toBeNull();
  });
});

describe('uploads that make csv-parse fail answer 400 with the line', () => {
  const before = () => (t.sqlite().prepare('SELECT COUNT(*) AS n FROM datasets').get() as { n: number }).n;

  it.each([
    // [csv-parse code it raises, file, line, words the user sees]
    ['INVALID_OPENING_QUOTE', 'a,b\n1,5" pipe\n', 2, /quote .*inside a cell that does not start with one/],
    ['INVALID_OPENING_QUOTE', 'phi,n\n1,2\n3,4\n5,6 "x"\n', 4, /column 2/],
    ['CSV_INVALID_CLOSING_QUOTE', 'a,b\n"1"x,2\n', 2, /closing quote .*followed by "x"/],
    ['CSV_QUOTE_NOT_CLOSED', 'a,b\n1,2\n3,"4\n', 3, /column 2 .*never closed/],
  ] as const)('%s: %j', async (_code, csv, line, words) => {
    const n = before();
    const res = await upload(csv);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(new RegExp(`line ${line}\\b`));
    expect(res.body.message).toMatch(words);
    expect(res.body.details[0]).toMatchObject({ path: 'file', line });
    expect(before()).toBe(n);
  });

  it('CSV_MAX_RECORD_SIZE: a row longer than the record limit', async () => {
    const csv = `a,b\n1,2\n3,${'9'.repeat(MAX_RECORD_BYTES + 10)}\n`;
    const res = await upload(csv);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/line 3\b/);
    expect(res.body.message).toMatch(/longer than/);
  });
});
