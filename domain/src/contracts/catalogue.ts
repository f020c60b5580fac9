import { SWEEP_STATUSES } from './sweeps.js';
import { z } from 'zod';

/*
 * Catalogue contracts (SPEC §6): the sweep list, a sweep's result pages, plot series and sharing.
 * Query strings arrive as text, so numbers are coerced; every schema is strict so a misspelt
 * parameter is a 400 naming it rather than a silently ignored filter.
 */

/** Statuses a catalogue query may filter by: every sweep status. */
export const CATALOGUE_STATUSES = SWEEP_STATUSES;
export const CATALOGUE_SCOPES = ['all', 'mine', 'shared', 'archived'] as const;
export const CATALOGUE_SORT_KEYS = ['name', 'createdAt', 'finishedAt', 'points', 'status', 'model'] as const;
export type CatalogueScope = (typeof CATALOGUE_SCOPES)[number];
export type CatalogueSortKey = (typeof CATALOGUE_SORT_KEYS)[number];

/** A list parameter given once as `a,b` or repeated (`status=a&status=b`). */
function listParam<T extends z.ZodType<string, string>>(item: T, max: number) {
  return z
    .union([z.string(), z.array(z.string())])
    .transform((v) =>
      (Array.isArray(v) ? v : [v])
        .flatMap((s) => s.split(','))
        .map((s) => s.trim())
        .filter(Boolean),
    )
    .pipe(z.array(item).max(max, `at most ${max} values`));
}

const pageParam = z.coerce.number().int('must be a whole number').min(1, 'pages start at 1').default(1);
const pageSizeParam = z.coerce
  .number()
  .int('must be a whole number')
  .min(1, 'must be at least 1')
  .max(1000, 'at most 1000')
  .default(50);

/** An ISO 8601 date or date-time; returns epoch milliseconds. */
const dateParam = z
  .string()
  .max(40)
  .refine((s) => /^\d{4}-\d{2}-\d{2}([T ][\d:.]+(Z|[+-]\d{2}:?\d{2})?)?$/.test(s) && Number.isFinite(Date.parse(s)), {
    message: 'expected an ISO 8601 date such as 2025-03-01 or 2025-03-01T12:00:00Z',
  })
  .transform((s) => Date.parse(s));

const countParam = z.coerce
  .number()
  .int('must be a whole number')
  .min(0, 'must be 0 or more')
  .max(1e12, 'at most 10¹²');
const boolParam = z.enum(['true', 'false'], { message: 'expected true or false' }).transform((v) => v === 'true');

/** GET /api/sweeps */
export const sweepListQuerySchema = z
  .object({
    page: pageParam,
    pageSize: pageSizeParam,
    sort: z
      .string()
      .regex(
        new RegExp(`^(${CATALOGUE_SORT_KEYS.join('|')})(:(asc|desc))?$`),
        `expected one of ${CATALOGUE_SORT_KEYS.join(', ')} with :asc or :desc`,
      )
      .default('createdAt:desc'),
    q: z.string().trim().max(200, 'at most 200 characters').optional(),
    model: listParam(z.string().regex(/^[a-z0-9-]{1,64}$/, 'expected a model id such as cross-field'), 10).optional(),
    status: listParam(
      z.enum(CATALOGUE_STATUSES, { message: `expected one of ${CATALOGUE_STATUSES.join(', ')}` }),
      7,
    ).optional(),
    owner: z
      .union([z.literal('me'), z.coerce.number().int().positive()], { message: 'expected a user id or "me"' })
      .optional(),
    tag: listParam(z.string().max(64, 'tags are at most 64 characters'), 20).optional(),
    createdFrom: dateParam.optional(),
    createdTo: dateParam.optional(),
    finishedFrom: dateParam.optional(),
    finishedTo: dateParam.optional(),
    minPoints: countParam.optional(),
    maxPoints: countParam.optional(),
    scope: z.enum(CATALOGUE_SCOPES, { message: `expected one of ${CATALOGUE_SCOPES.join(', ')}` }).default('all'),
  })
  .strict();
export type SweepListQuery = z.infer<typeof sweepListQuerySchema>;

/** GET /api/sweeps/:id/results — sort and filter are checked against the sweep's own columns. */
export const resultsQuerySchema = z
  .object({
    page: pageParam,
    pageSize: pageSizeParam,
    sort: z.string().max(80, 'at most 80 characters').optional(),
    filter: z.string().max(10_000, 'at most 10,000 characters').optional(),
    /** Shorthand for `filter={"valid":{"eq":…}}`. */
    valid: boolParam.optional(),
  })
  .strict();
export type ResultsQuery = z.infer<typeof resultsQuerySchema>;

const columnName = z.string().regex(/^[A-Za-z_][A-Za-z0-9_]{0,63}$/, 'expected a column name');

/**
 * GET /api/sweeps/:id/series. `slice.<param>=k` picks grid value k of a swept input that is not
 * plotted (default 0, the first value); `agg=mean` averages over those inputs instead. `groups=0,7,14`
 * picks which grid values of the groupBy input are drawn as lines (needed when it has more than 20).
 */
export const seriesQuerySchema = z
  .object({
    kind: z.enum(['line', 'heatmap'], { message: 'expected line or heatmap' }).default('line'),
    x: columnName,
    y: columnName,
    z: columnName.optional(),
    groupBy: columnName.optional(),
    groups: listParam(z.string().regex(/^\d{1,9}$/, 'expected grid value numbers such as 0,7,14'), 20)
      .transform((v) => [...new Set(v.map(Number))].sort((a, b) => a - b))
      .optional(),
    maxPoints: z.coerce
      .number()
      .int('must be a whole number')
      .min(2, 'at least 2')
      .max(20_000, 'at most 20,000')
      .default(2000),
    filter: z.string().max(10_000, 'at most 10,000 characters').optional(),
    valid: boolParam.optional(),
    agg: z.enum(['slice', 'mean'], { message: 'expected slice or mean' }).default('slice'),
    slice: z
      .record(columnName, z.coerce.number().int('must be a whole number').min(0, 'must be 0 or more'))
      .default({}),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.groups && !v.groupBy)
      ctx.addIssue({ code: 'custom', path: ['groups'], message: 'groups picks values of groupBy; give groupBy too' });
    if (v.kind === 'heatmap' && !v.z)
      ctx.addIssue({ code: 'custom', path: ['z'], message: 'a heatmap needs z, the column shown as colour' });
  });
export type SeriesQuery = z.infer<typeof seriesQuerySchema>;

/** Folds `slice.Te_eV=3` (flat keys) or `slice[Te_eV]=3` (nested) into `slice: { Te_eV: '3' }`. */
export function foldSliceParams(raw: unknown): unknown {
  if (!raw || typeof raw !== 'object') return raw;
  const out: Record<string, unknown> = {};
  const slice: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(raw as Record<string, unknown>)) {
    if (k.startsWith('slice.')) slice[k.slice(6)] = v;
    else if (k === 'slice' && v && typeof v === 'object' && !Array.isArray(v)) Object.assign(slice, v);
    else out[k] = v;
  }
  if (Object.keys(slice).length) out.slice = slice;
  return out;
}

/** PUT /api/sweeps/:id/sharing — replaces the sweep's visibility and named readers. */
export const sweepSharingSchema = z
  .object({
    visibility: z.enum(['private', 'group'], { message: 'expected private or group' }),
    userIds: z.array(z.number().int().positive('expected a user id')).max(200, 'at most 200 users').default([]),
  })
  .strict();
export type SweepSharing = z.infer<typeof sweepSharingSchema>;

/** GET /api/users/directory */
export const directoryQuerySchema = z
  .object({
    q: z.string().trim().max(100, 'at most 100 characters').optional(),
    pageSize: z.coerce.number().int().min(1).max(200, 'at most 200').default(50),
  })
  .strict();

/* ---------- response shapes ---------- */

export interface SweepSummary {
  id: number;
  name: string;
  description: string | null;
  model: string;
  status: (typeof CATALOGUE_STATUSES)[number];
  points: number;
  progress: { done: number; total: number; fraction: number };
  tags: string[];
  owner: { id: number; name: string };
  visibility: 'private' | 'group';
  sharedWithMe: boolean;
  invalidPoints: number;
  createdAt: string;
  finishedAt: string | null;
  archivedAt: string | null;
}

export interface SeriesAxis {
  name: string;
  unit: string;
  kind: string;
  meaning: string;
  /** The swept axis kind, when this column is swept (a log axis suggests a log scale). */
  axisKind?: 'linear' | 'log' | 'list';
}

export interface SeriesFlag {
  code: string;
  bit: number;
  meaning: string;
  invalidates: boolean;
}

export interface LineSeries {
  kind: 'line';
  x: SeriesAxis;
  y: SeriesAxis;
  groupBy: SeriesAxis | null;
  /** Points as [x, y, flag mask, point index], sorted by x. */
  groups: { value: number | null; points: [number | null, number | null, number, number][] }[];
  method: 'grid-slice' | 'stride';
  total: number;
  returned: number;
  slice: Record<string, { index: number; value: number; unit: string }>;
  flags: SeriesFlag[];
  invalidMask: number;
}

export interface HeatmapSeries {
  kind: 'heatmap';
  x: SeriesAxis & { values: number[] };
  y: SeriesAxis & { values: number[] };
  z: SeriesAxis;
  /**
   * Cells as [xIndex, yIndex, z, flagged (0/1), fraction of the cell's points flagged, point index]; the
   * index is null for averaged or binned cells (many points).
   */
  cells: [number, number, number | null, 0 | 1, number, number | null][];
  method: 'grid-slice' | 'grid-mean' | 'binned-mean';
  zRange: [number, number] | null;
  slice: Record<string, { index: number; value: number; unit: string }>;
  flags: SeriesFlag[];
  invalidMask: number;
}

export type Series = LineSeries | HeatmapSeries;

export interface DirectoryUser {
  id: number;
  name: string;
  role: string;
}
