/**
 * Test support: reads the reference CSV files in tests/reference/physics/ (sources in the README
 * there). Node only; not exported from the package index.
 */
import { readFileSync } from 'node:fs';

/** Split one CSV line, honouring double-quoted fields. */
function splitLine(line: string): string[] {
  const cells: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i]!;
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      cells.push(cur);
      cur = '';
    } else cur += ch;
  }
  cells.push(cur);
  return cells;
}

export function readReferenceCsv(file: string): Record<string, string>[] {
  const url = new URL(`../../../tests/reference/physics/${file}`, import.meta.url);
  const lines = readFileSync(url, 'utf8')
    .split(/\r?\n/)
    .filter((l) => l.trim() !== '');
  const header = splitLine(lines[0]!);
  return lines.slice(1).map((l) => {
    const cells = splitLine(l);
    return Object.fromEntries(header.map((h, i) => [h, cells[i] ?? '']));
  });
}

/** The numeric value of the row whose `key` column contains `needle` (exactly one must match, or exactly one ending with it). */
export function referenceValue(
  rows: Record<string, string>[],
  key: string,
  needle: string,
  valueColumn: string,
): number {
  let hits = rows.filter((r) => (r[key] ?? '').includes(needle));
  // "gamma=1" also occurs inside "gamma=1.667": prefer the rows that end with the needle.
  if (hits.length > 1) hits = hits.filter((r) => (r[key] ?? '').endsWith(needle));
  if (hits.length !== 1) throw new Error(`reference row "${needle}" matched ${hits.length} rows`);
  return Number(hits[0]![valueColumn]);
}
