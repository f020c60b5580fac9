import { ValidationError } from '@driftgrid/domain';

/** Longest row the reader accepts; a longer one is a broken file (an unclosed quote swallowing the rest). */
export const MAX_RECORD_BYTES = 1024 * 1024;

/** The context csv-parse copies onto its errors (CsvError assigns every context key to itself). */
interface Failure {
  code: string;
  lines?: number;
  /** Index of the field within its row (0-based). */
  column?: number;
  record?: unknown[];
  field?: string;
  /** The character after a closing quote, from the library's message. */
  after?: string;
}

type Words = (f: Failure) => string;

const cell = (f: Failure) => (typeof f.column === 'number' ? `column ${f.column + 1}` : 'a cell');
const snippet = (s: string | undefined) => (s ? ` ("${s.slice(0, 30)}")` : '');

/** Errors a file's content can cause, in the user's words with the fix. */
const CONTENT: Record<string, Words> = {
  INVALID_OPENING_QUOTE: (f) =>
    `a quote (") is inside a cell that does not start with one, in ${cell(f)}${snippet(f.field)}: put the whole cell in quotes and double the quote inside ("5"" pipe"), or remove it`,
  CSV_INVALID_CLOSING_QUOTE: (f) =>
    `the closing quote of a quoted cell in ${cell(f)} is followed by ${f.after ? `"${f.after}"` : 'other characters'} instead of a comma or the end of the line: double a quote meant as text ("")`,
  CSV_NON_TRIMABLE_CHAR_AFTER_CLOSING_QUOTE: (f) =>
    `the closing quote of a quoted cell in ${cell(f)} is followed by other characters before the comma`,
  CSV_QUOTE_NOT_CLOSED: (f) =>
    `a quoted cell in ${cell(f)} is never closed: the rest of the file was read as part of it; add the closing quote`,
  CSV_MAX_RECORD_SIZE: () =>
    `the row is longer than ${MAX_RECORD_BYTES / 1024 / 1024} MB; check for a quote that is never closed`,
  CSV_RECORD_INCONSISTENT_FIELDS_LENGTH: (f) =>
    `the row has ${Array.isArray(f.record) ? f.record.length : 'a different number of'} fields; every row needs as many as the header`,
  CSV_RECORD_INCONSISTENT_COLUMNS: (f) =>
    `the row has ${Array.isArray(f.record) ? f.record.length : 'a different number of'} fields; every row needs as many as the header`,
};

/**
 * Codes csv-parse raises only for a bad option, argument or column definition. The reader passes
 * fixed options, so these mean the file could not be read for a reason the user cannot fix; they
 * still answer 400 with the line rather than a bare 500.
 */
const SETUP = [
  'CSV_IGNORE_LAST_DELIMITERS_REQUIRES_COLUMNS',
  'CSV_INVALID_ARGUMENT',
  'CSV_INVALID_COLUMN_DEFINITION',
  'CSV_INVALID_COLUMN_MAPPING',
  'CSV_INVALID_OPTION_BOM',
  'CSV_INVALID_OPTION_CAST',
  'CSV_INVALID_OPTION_CAST_DATE',
  'CSV_INVALID_OPTION_COLUMNS',
  'CSV_INVALID_OPTION_COMMENT',
  'CSV_INVALID_OPTION_DELIMITER',
  'CSV_INVALID_OPTION_DELIMITER_AUTO',
  'CSV_INVALID_OPTION_ENCODING',
  'CSV_INVALID_OPTION_GROUP_COLUMNS_BY_NAME',
  'CSV_INVALID_OPTION_IGNORE_LAST_DELIMITERS',
  'CSV_INVALID_OPTION_ON_RECORD',
  'CSV_INVALID_OPTION_RECORD_DELIMITER',
  'CSV_OPTION_COLUMNS_MISSING_NAME',
] as const;

/** Every csv-parse code with wording here (a test compares it with csv-parse's source). */
export const CSV_PARSE_CODES: readonly string[] = [...Object.keys(CONTENT), ...SETUP];

const fallback: Words = () => 'the file could not be read as comma-separated values';

/**
 * A csv-parse failure as a ValidationError (HTTP 400) naming the line, or null when `err` is not
 * from the parser. csv-parse's own messages name its options and codes, so they are not shown.
 */
export function csvParseFailure(err: unknown): ValidationError | null {
  if (typeof err !== 'object' || err === null) return null;
  const e = err as Partial<Failure>;
  if (typeof e.code !== 'string' || !(e.code.startsWith('CSV_') || e.code === 'INVALID_OPENING_QUOTE')) return null;
  const f: Failure = {
    code: e.code,
    lines: typeof e.lines === 'number' && e.lines > 0 ? e.lines : undefined,
    column: typeof e.column === 'number' ? e.column : undefined,
    record: Array.isArray(e.record) ? e.record : undefined,
    field: typeof e.field === 'string' ? e.field : undefined,
    after: (err as Error).message?.match?.(/got "(.)"/)?.[1],
  };
  const message = (CONTENT[f.code] ?? fallback)(f);
  return new ValidationError(`The file is not valid CSV${f.lines ? ` at line ${f.lines}` : ''}: ${message}`, [
    { path: 'file', ...(f.lines ? { line: f.lines } : {}), message },
  ]);
}
