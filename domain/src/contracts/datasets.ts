import { z } from 'zod';
import { safeName } from './text-safety.js';

/* ---------- uploaded datasets (SPEC §6) ---------- */

/** Longest column name accepted in a CSV header (names are keys for fits and plots). */
export const DATASET_COLUMN_NAME_MAX = 128;
/** Most columns one dataset may have. */
export const DATASET_MAX_COLUMNS = 256;
/** Row-level problems reported per rejected file; the message says when there were more. */
export const DATASET_ERROR_CAP = 50;

export const datasetVisibilitySchema = z.enum(['private', 'group']);
export type DatasetVisibility = z.infer<typeof datasetVisibilitySchema>;

/** `{ column: unit }`: mathjs unit strings ("V", "cm^-3", "eV", "K"); "" or "1" = dimensionless. */
export const datasetUnitsSchema = z.record(
  z
    .string()
    .min(1, 'column name required')
    .max(DATASET_COLUMN_NAME_MAX, `at most ${DATASET_COLUMN_NAME_MAX} characters`),
  z.string().trim().max(64, 'at most 64 characters'),
);
export type DatasetUnits = z.infer<typeof datasetUnitsSchema>;

/** The text fields sent beside the multipart `file` (units arrive as JSON text). */
export const datasetUploadFieldsSchema = z.object({
  name: safeName(z.string().trim().min(1, 'required').max(200, 'at most 200 characters')).optional(),
  units: z
    .string()
    .max(20_000, 'at most 20,000 characters')
    .transform((text, ctx) => {
      if (text.trim() === '') return {};
      try {
        return JSON.parse(text) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'must be JSON like {"phi": "V", "n": "cm^-3"}' });
        return z.NEVER;
      }
    })
    .pipe(datasetUnitsSchema)
    .optional(),
  visibility: datasetVisibilitySchema.optional(),
});
export type DatasetUploadFields = z.infer<typeof datasetUploadFieldsSchema>;

const page = z.coerce.number().int('must be a whole number').min(1, 'at least 1').default(1);
const pageSize = z.coerce
  .number()
  .int('must be a whole number')
  .min(1, 'at least 1')
  .max(1000, 'at most 1000')
  .default(50);

export const datasetListQuerySchema = z.object({
  page,
  pageSize,
  q: z.string().trim().max(200, 'at most 200 characters').optional(),
});
export type DatasetListQuery = z.infer<typeof datasetListQuerySchema>;

export const datasetRowsQuerySchema = z.object({ page, pageSize });
export type DatasetRowsQuery = z.infer<typeof datasetRowsQuerySchema>;

export const datasetSeriesQuerySchema = z.object({
  x: z.string().min(1, 'required').max(DATASET_COLUMN_NAME_MAX),
  y: z.string().min(1, 'required').max(DATASET_COLUMN_NAME_MAX),
  maxPoints: z.coerce
    .number()
    .int('must be a whole number')
    .min(2, 'at least 2')
    .max(200_000, 'at most 200,000')
    .default(5000),
});
export type DatasetSeriesQuery = z.infer<typeof datasetSeriesQuerySchema>;

/** PUT /api/datasets/:id/sharing: replaces the visibility and the list of users it is shared with. */
export const datasetSharingSchema = z
  .object({
    visibility: datasetVisibilitySchema.optional(),
    userIds: z.array(z.number().int().positive('must be a user id')).max(500, 'at most 500 users').optional(),
  })
  .strict();
export type DatasetSharing = z.infer<typeof datasetSharingSchema>;

/** Column metadata stored with a dataset; numeric values are stored in `canonicalUnit`. */
export interface DatasetColumn {
  name: string;
  kind: 'number' | 'text';
  /** The unit as given at upload ('' when none). */
  unit: string;
  /** The unit values are stored in: SI, temperatures and energies in eV; '' for text, '1' dimensionless. */
  canonicalUnit: string;
  /** Physical quantity recognised from the unit's dimension ('potential', 'density', …) or null. */
  quantity: string | null;
}

export interface DatasetUploadResult {
  id: number;
  name: string;
  rows: number;
  columns: DatasetColumn[];
}

export interface DatasetView {
  id: number;
  name: string;
  fileName: string | null;
  rows: number;
  columns: DatasetColumn[];
  visibility: DatasetVisibility;
  sha256: string;
  owner: { id: number; name: string };
  sharedWith: number[];
  createdAt: string;
}

export interface DatasetRowsPage {
  items: { row: number; cells: (number | string | null)[] }[];
  total: number;
  page: number;
  pageSize: number;
  columns: DatasetColumn[];
}

/** GET /api/datasets/:id/series: points for an overlay, canonical units, rows with a gap skipped. */
export interface DatasetSeries {
  x: { name: string; unit: string; quantity: string | null };
  y: { name: string; unit: string; quantity: string | null };
  /** Points returned (after even-stride thinning to maxPoints). */
  n: number;
  /** Rows with both values present, before thinning. */
  total: number;
  points: { x: number[]; y: number[] };
}

/** A CSV cell as an uploader writes it: plain decimal or exponent literals only (no hex, no Infinity). */
export const CSV_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** Cells read as a missing value in a numeric column. */
export const CSV_MISSING = new Set(['', 'NaN', 'nan', 'NA', 'N/A', 'null']);

/**
 * Spreadsheet formula guard (OWASP "CSV Injection"): a text cell starting with =, +, -, @, tab or
 * carriage return is prefixed with a single quote when written to CSV, so a spreadsheet shows it
 * as text instead of running it.
 */
export function neutralizeFormula(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}
