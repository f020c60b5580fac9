/**
 * A small RFC 4180 reader for the upload preview only: the first rows of the chosen file, read in
 * the browser before anything is sent. The server parses the whole file again and is the authority.
 */

export interface CsvPreview {
  header: string[];
  rows: string[][];
  /** True when the preview stopped before the end of the text it was given. */
  truncated: boolean;
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export function parseCsvPreview(text: string, maxRows = 10): CsvPreview {
  const records: string[][] = [];
  let field = '';
  let record: string[] = [];
  let quoted = false;
  let i = 0;
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const push = () => {
    record.push(field);
    field = '';
  };
  const endRecord = () => {
    push();
    if (!(record.length === 1 && record[0] === '')) records.push(record);
    record = [];
  };
  for (; i < src.length && records.length <= maxRows; i++) {
    const c = src[i];
    if (quoted) {
      if (c === '"') {
        if (src[i + 1] === '"') {
          field += '"';
          i++;
        } else quoted = false;
      } else field += c;
    } else if (c === '"' && field === '') quoted = true;
    else if (c === ',') push();
    else if (c === '\n') endRecord();
    else if (c !== '\r') field += c;
  }
  const atEnd = i >= src.length;
  if (atEnd && (field !== '' || record.length)) endRecord();
  const [header = [], ...rows] = records;
  return {
    header: header.map((h) => h.trim()),
    rows: rows.slice(0, maxRows),
    truncated: !atEnd || rows.length > maxRows,
  };
}

/** Whether the preview's cells of column j look numeric (the server decides on the whole file). */
export function looksNumeric(preview: CsvPreview, j: number): boolean {
  const cells = preview.rows.map((r) => (r[j] ?? '').trim()).filter((c) => c !== '');
  return cells.length > 0 && cells.every((c) => NUMBER.test(c));
}

/** Unit guesses from common column-name suffixes (`phi_V`, `n_m3`, `Te_eV`); the user can change them. */
export function guessUnit(name: string): string {
  const m = /_(eV|keV|K|V|kV|T|G|m|cm|mm|m3|cm3|m_3|Vm|ms|s|Hz|A|Pa)$/.exec(name);
  if (!m) return '';
  const map: Record<string, string> = { m3: 'm^-3', cm3: 'cm^-3', m_3: 'm^-3', Vm: 'V/m', ms: 'm/s' };
  return map[m[1]] ?? m[1];
}
