import { neutralizeFormula } from '@driftgrid/domain';

/**
 * CSV writing for exports (RFC 4180: comma separated, CRLF-free "\n" line ends, fields with a comma,
 * quote or line break quoted and their quotes doubled).
 */

const NEEDS_QUOTES = /[",\r\n]/;

/** One text field, quoted when needed. Does not neutralise formulas (see textCell). */
export function csvField(text: string): string {
  return NEEDS_QUOTES.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/**
 * A text cell from user data: formula-looking text (=, +, -, @, tab, CR first) gets a leading single
 * quote — the OWASP "CSV Injection" advice — so a spreadsheet opening the export shows it as text.
 */
export function textCell(text: string): string {
  return csvField(neutralizeFormula(text));
}

export function csvLine(fields: readonly string[]): string {
  return fields.map(csvField).join(',') + '\n';
}

/** A line of user text (names, units, meanings): every field gets the formula guard of textCell. */
export function textLine(fields: readonly string[]): string {
  return fields.map(textCell).join(',') + '\n';
}

/** How a stored value is written: numbers at full precision (±Infinity as words), booleans as words, NULL as NaN. */
export type CellFormat = 'number' | 'boolean';

/**
 * Formats one row. `String(number)` is the shortest text that reads back to the same double
 * (ECMAScript Number::toString), so the CSV loses no precision and stays compact.
 */
export function formatRow(row: readonly (number | null)[], formats: readonly CellFormat[]): string {
  let s = '';
  const n = row.length;
  for (let j = 0; j < n; j++) {
    const v = row[j];
    if (j > 0) s += ',';
    if (v === null) {
      if (formats[j] !== 'boolean') s += 'NaN';
      continue;
    }
    s += formats[j] === 'boolean' ? (v === 0 ? 'false' : 'true') : String(v);
  }
  return s + '\n';
}

/**
 * Formats a batch of rows at once (the export's hot path). JSON.stringify writes finite numbers with
 * exactly the same ECMAScript Number::toString text as String(number) but several times faster
 * (no string per number); the array punctuation is then turned into CSV. NULL becomes an empty cell
 * and boolean columns are written as true/false. Mutates `rows` (booleans), which the caller owns.
 */
export function formatBatch(rows: (number | boolean | null)[][], booleanColumns: readonly number[]): string {
  if (rows.length === 0) return '';
  if (booleanColumns.length) {
    for (const r of rows) for (const j of booleanColumns) if (r[j] !== null) r[j] = r[j] !== 0;
  }
  // JSON writes ±Infinity as null: mark them first (a string, so quoted) and unquote after.
  let marked = false;
  for (const r of rows)
    for (let j = 0; j < r.length; j++) {
      const v = r[j];
      if (v === Infinity || v === -Infinity) {
        (r as unknown[])[j] = v > 0 ? 'Infinity' : '-Infinity';
        marked = true;
      }
    }
  const json = JSON.stringify(rows);
  // "[[a,b],[c,null]]" → "a,b\nc,NaN\n": NULL is how SQLite keeps NaN; no number's text contains
  // "null", "[" or "]". Boolean columns hold no NULL.
  const text = json.slice(2, -2).replaceAll('],[', '\n').replaceAll('null', 'NaN') + '\n';
  return marked ? text.replaceAll('"', '') : text;
}

/** A slug for file names: lowercase ASCII letters, digits and dashes only, never empty. */
export function slugify(name: string, fallback = 'export'): string {
  const slug = name
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/g, '');
  return slug || fallback;
}

/** Content-Disposition for a download; the name is already a safe slug, so no encoding is needed. */
export function attachment(fileName: string): string {
  return `attachment; filename="${fileName}"`;
}
