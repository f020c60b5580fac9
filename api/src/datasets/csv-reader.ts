import { parse } from 'csv-parse/sync';
import {
  CSV_MISSING,
  CSV_NUMBER,
  DATASET_COLUMN_NAME_MAX,
  DATASET_ERROR_CAP,
  DATASET_MAX_COLUMNS,
  TooLargeError,
  ValidationError,
  type DatasetColumn,
  type DatasetUnits,
  type ErrorDetail,
  unsafeNameProblem,
} from '@driftgrid/domain';
import { columnConversion, toCanonical, type ColumnConversion } from './column-units.js';
import { csvParseFailure, MAX_RECORD_BYTES } from './csv-parse-errors.js';
import { assertUtf8Text } from './text-encoding.js';

export type Cell = number | string | null;

export interface ParsedDataset {
  columns: DatasetColumn[];
  /** Data rows in file order; numeric cells already in canonical units. */
  rows: Cell[][];
}

interface RawRecord {
  record: string[];
  info: { lines: number };
}

/** A problem in one cell (or one line when `column` is omitted). */
interface RowProblem {
  line: number;
  column?: string;
  message: string;
}

const isNumber = (s: string) => CSV_NUMBER.test(s);

/**
 * Reads an uploaded CSV (header row, comma-separated, RFC 4180 quoting) with csv-parse. Columns whose
 * cells are all numbers become numeric and are converted to canonical units; the rest stay text,
 * verbatim (formula-looking text is neutralised only when exported). Every problem found is reported
 * with its line and column, up to DATASET_ERROR_CAP; a file with any problem is rejected as a whole.
 */
export function parseDatasetCsv(input: Buffer, opts: { maxRows: number; units?: DatasetUnits }): ParsedDataset {
  assertUtf8Text(input);
  const records = readRecords(input, opts.maxRows);
  if (records.length === 0)
    throw invalid('The file is empty; expected a header row and data rows', [{ path: 'file', message: 'no rows' }]);
  const header = checkHeader(records[0]);
  const data = records.slice(1);
  if (data.length === 0)
    throw invalid('The file has a header row but no data rows', [{ path: 'file', line: 2, message: 'no data rows' }]);
  if (data.length > opts.maxRows) {
    throw new TooLargeError(`The file has more than ${opts.maxRows} data rows, the upload limit (UPLOAD_MAX_ROWS)`, [
      { path: 'file', message: `at most ${opts.maxRows} data rows` },
    ]);
  }

  const units = opts.units ?? {};
  for (const name of Object.keys(units)) {
    if (!header.includes(name)) {
      throw invalid(`units names a column the file does not have: "${name}"`, [
        { path: `units.${name}`, column: name, message: `no such column; the header has ${header.join(', ')}` },
      ]);
    }
  }
  const unitDetails: ErrorDetail[] = [];
  const conversions = header.map((name): ColumnConversion | null => {
    try {
      return units[name] ? columnConversion(name, units[name]) : null;
    } catch (err) {
      if (err instanceof ValidationError && err.details) unitDetails.push(...err.details);
      else throw err;
      return null;
    }
  });
  if (unitDetails.length)
    throw new ValidationError(
      `Unknown unit for column "${unitDetails[0].column}": ${unitDetails[0].message}`,
      unitDetails,
    );

  const problems: RowProblem[] = [];
  const width = header.length;
  for (const r of data) {
    if (r.record.length !== width) {
      problems.push({ line: r.info.lines, message: `has ${r.record.length} fields; the header has ${width}` });
    }
  }
  const kinds = header.map((name, j) => classify(data, j, conversions[j] !== null));
  header.forEach((name, j) => {
    if (kinds[j] !== 'number') return;
    for (const r of data) {
      const cell = (r.record[j] ?? '').trim();
      if (!CSV_MISSING.has(cell) && !isNumber(cell)) {
        problems.push({
          line: r.info.lines,
          column: name,
          message: `"${cell.slice(0, 40)}" is not a number; the column is numeric${conversions[j] ? ` (unit ${conversions[j]!.unit})` : ''}: fix the cell or leave it empty`,
        });
      } else if (isNumber(cell) && !Number.isFinite(Number(cell))) {
        problems.push({
          line: r.info.lines,
          column: name,
          message: `"${cell.slice(0, 40)}" is outside the range of a double`,
        });
      }
    }
  });
  if (problems.length) throw rowErrors(problems);

  const columns: DatasetColumn[] = header.map((name, j) => {
    const c = conversions[j];
    if (kinds[j] === 'text') return { name, kind: 'text', unit: '', canonicalUnit: '', quantity: null };
    return {
      name,
      kind: 'number',
      unit: c?.unit ?? '',
      canonicalUnit: c?.canonicalUnit ?? '1',
      quantity: c?.quantity ?? null,
    };
  });
  const rows = data.map((r) =>
    r.record.map((raw, j): Cell => {
      if (kinds[j] === 'text') return raw;
      const cell = raw.trim();
      if (CSV_MISSING.has(cell)) return null;
      const v = Number(cell);
      return conversions[j] ? toCanonical(conversions[j]!, v) : v;
    }),
  );
  return { columns, rows };
}

function readRecords(input: Buffer, maxRows: number): RawRecord[] {
  try {
    // `to` stops reading one record past the limit: enough to know the file is too long.
    return parse(input, {
      bom: true,
      relax_column_count: true,
      skip_empty_lines: true,
      info: true,
      to: maxRows + 2,
      max_record_size: MAX_RECORD_BYTES,
    }) as unknown as RawRecord[];
  } catch (err) {
    throw csvParseFailure(err) ?? err;
  }
}

/** The header must name every column once; a first row of numbers means the header is missing. */
function checkHeader(first: RawRecord): string[] {
  const names = first.record.map((s) => s.trim());
  if (names.length > DATASET_MAX_COLUMNS) {
    throw invalid(`The file has ${names.length} columns; at most ${DATASET_MAX_COLUMNS} are allowed`, [
      { path: 'file', line: 1, message: `at most ${DATASET_MAX_COLUMNS} columns` },
    ]);
  }
  if (names.every((n) => isNumber(n) || n === '')) {
    throw invalid('The first row holds numbers, not column names: add a header row (for example "phi,n")', [
      { path: 'file', line: 1, message: 'missing header row' },
    ]);
  }
  const problems: RowProblem[] = [];
  const seen = new Set<string>();
  names.forEach((n, j) => {
    const col = `#${j + 1}`;
    const unsafe = unsafeNameProblem(n);
    if (n === '')
      problems.push({ line: first.info.lines, column: col, message: `column ${j + 1} has no name in the header` });
    else if (unsafe) problems.push({ line: first.info.lines, column: col, message: `the name ${unsafe}` });
    else if (n.length > DATASET_COLUMN_NAME_MAX)
      problems.push({
        line: first.info.lines,
        column: col,
        message: `the name is longer than ${DATASET_COLUMN_NAME_MAX} characters`,
      });
    else if (seen.has(n))
      problems.push({ line: first.info.lines, column: n, message: `the name "${n}" appears twice in the header` });
    seen.add(n);
  });
  if (problems.length) throw rowErrors(problems);
  return names;
}

/**
 * A column is numeric when a unit is given for it, or when its first present cell and most of its
 * cells are numbers; stray words in such a column are reported instead of silently turning it to text.
 */
function classify(data: RawRecord[], j: number, hasUnit: boolean): 'number' | 'text' {
  if (hasUnit) return 'number';
  let numbers = 0;
  let present = 0;
  let firstIsNumber: boolean | null = null;
  for (const r of data) {
    const cell = (r.record[j] ?? '').trim();
    if (CSV_MISSING.has(cell)) continue;
    present++;
    const num = isNumber(cell);
    if (num) numbers++;
    if (firstIsNumber === null) firstIsNumber = num;
  }
  if (present === 0) return 'text';
  return firstIsNumber && numbers * 2 > present ? 'number' : 'text';
}

function rowErrors(problems: RowProblem[]): ValidationError {
  problems.sort((a, b) => a.line - b.line);
  const shown = problems.slice(0, DATASET_ERROR_CAP);
  const more = problems.length > shown.length ? ` (showing the first ${DATASET_ERROR_CAP} of ${problems.length})` : '';
  const p = shown[0];
  const details: ErrorDetail[] = shown.map((x) => ({
    path: 'file',
    line: x.line,
    ...(x.column ? { column: x.column } : {}),
    message: x.message,
  }));
  return new ValidationError(
    `The file has ${problems.length} problem${problems.length === 1 ? '' : 's'}${more}; first at line ${p.line}${p.column ? `, column ${p.column}` : ''}: ${p.message}`,
    details,
  );
}

function invalid(message: string, details: ErrorDetail[]): ValidationError {
  return new ValidationError(message, details);
}
