import { z } from 'zod';
import type { ErrorDetail } from '../errors.js';
import type { PointEvaluation } from '../sweep/compile.js';
import { sweepDefinitionSchema, type SweepDefinitionInput } from '../sweep/schema.js';
import type { QuotaVerdict } from './accounts.js';

/**
 * The envelope of a submitted or previewed sweep definition: a JSON object. Only the envelope is
 * checked at the controller; the definition itself goes through checkSweep, which reports every
 * problem at once with the builder's labels (a schema parse here would stop at the first
 * structural error and hide the rest).
 */
export const sweepSubmissionSchema = z.record(z.string(), z.unknown(), {
  error: 'the sweep definition must be a JSON object',
});
export type SweepSubmission = z.infer<typeof sweepSubmissionSchema>;

/** Every state a sweep can be in; the api's table column and the ui's badges take this list. */
export const SWEEP_STATUSES = ['draft', 'queued', 'running', 'completed', 'failed', 'cancelled', 'archived'] as const;
export type SweepStatus = (typeof SWEEP_STATUSES)[number];

/**
 * States in which work is still pending or under way — for sweeps, their chunks and fits alike:
 * what cancelling stops, what the quota counts as running, and what the ui keeps polling.
 */
export const ACTIVE_STATES = ['queued', 'running'] as const;
export type ActiveState = (typeof ACTIVE_STATES)[number];

/** States in which a sweep's results are whole and final: what fits accept and the ui offers to export. */
export const COMPLETE_STATES = ['completed', 'archived'] as const satisfies readonly SweepStatus[];

/**
 * States in which a sweep's stored rows no longer change (finished one way or another): what may be
 * cached by its row count and finish time, such as the sorted orders of its results.
 */
export const SETTLED_STATES = [...COMPLETE_STATES, 'failed', 'cancelled'] as const satisfies readonly SweepStatus[];

/** True for a status in ACTIVE_STATES (takes any string: statuses arrive as text from the api). */
export function isActiveState(status: string): status is ActiveState {
  return (ACTIVE_STATES as readonly string[]).includes(status);
}

/* ---------- response shapes: what the api answers and the ui reads, declared once ---------- */

const count = z.number().int().nonnegative();
const isoDateTime = z.iso.datetime();

export const SWEEP_COLUMN_KINDS = ['index', 'input', 'output', 'derived', 'flags'] as const;
export const SWEEP_COLUMN_TYPES = ['int', 'float', 'boolean', 'mask'] as const;
export const SWEEP_INPUT_SOURCES = ['axis', 'fixed', 'expression', 'default'] as const;

/** One column of a sweep's results, in storage/export order (the compiled sweep's columns, as the api shows them). */
export const sweepColumnViewSchema = z.strictObject({
  name: z.string(),
  kind: z.enum(SWEEP_COLUMN_KINDS),
  /** Canonical unit (mathjs string, `1` dimensionless); empty for derived columns (unit unknown). */
  unit: z.string(),
  meaning: z.string(),
  type: z.enum(SWEEP_COLUMN_TYPES),
  /** Inputs only: where the value comes from. */
  source: z.enum(SWEEP_INPUT_SOURCES).optional(),
});
export type SweepColumnView = z.infer<typeof sweepColumnViewSchema>;

/**
 * The definition as submitted (it is stored as sent, after checkSweep refused anything unknown): the
 * written form, so defaults may be absent. Checked against the definition schema, typed as its input.
 */
const storedDefinitionSchema = z.custom<SweepDefinitionInput>(
  (v) => sweepDefinitionSchema.safeParse(v).success,
  'not a sweep definition',
);

/** GET /api/sweeps/:id (also the answer of cancel, sharing and archive). */
export const sweepViewSchema = z.strictObject({
  id: z.number().int().positive(),
  name: z.string(),
  model: z.string(),
  status: z.enum(SWEEP_STATUSES),
  points: count,
  progress: z.strictObject({ done: count, total: count, fraction: z.number().min(0).max(1) }),
  chunks: count,
  definition: storedDefinitionSchema,
  columns: z.array(sweepColumnViewSchema),
  tags: z.array(z.string()),
  owner: z.strictObject({ id: z.number().int(), name: z.string(), email: z.string() }),
  visibility: z.enum(['private', 'group']),
  sharedWith: z.array(z.number().int().positive()),
  createdAt: isoDateTime,
  startedAt: isoDateTime.nullable(),
  finishedAt: isoDateTime.nullable(),
  error: z.string().nullable(),
  flagsSummary: z.strictObject({ invalidPoints: count, byFlag: z.record(z.string(), count) }),
  provenance: z.strictObject({
    modelVersion: z.string(),
    appVersion: z.string(),
    computeMs: count,
    workers: z.array(z.strictObject({ id: z.string(), chunks: count, points: count })),
  }),
  /** Present once the sweep is archived: the frozen zip's digest and size. */
  archive: z
    .strictObject({
      sha256: z.string().regex(/^[0-9a-f]{64}$/),
      bytes: count.nullable(),
      archivedAt: isoDateTime.nullable(),
    })
    .optional(),
});
export type SweepView = z.infer<typeof sweepViewSchema>;

/**
 * One value of a results row. Booleans come as true/false; JSON has no ±Infinity or NaN, so numbers
 * that are not finite come as the strings "Infinity", "-Infinity" and "NaN" (the api's shapeRows).
 */
export const NON_FINITE_CELLS = ['Infinity', '-Infinity', 'NaN'] as const;
export const resultCellSchema = z.union([z.number(), z.boolean(), z.literal(NON_FINITE_CELLS), z.null()]);
export type ResultCell = z.infer<typeof resultCellSchema>;
export type ResultRowView = Record<string, ResultCell>;

/** GET /api/sweeps/:id/results */
export const resultsPageSchema = z.strictObject({
  rows: z.array(z.record(z.string(), resultCellSchema)),
  total: count,
  columns: z.array(sweepColumnViewSchema),
});
export type ResultsPage = z.infer<typeof resultsPageSchema>;

/** A cell as a number for plotting and sorting: the non-finite strings as their numbers, booleans as 0/1. */
export function cellNumber(v: ResultCell | undefined): number | null {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return v;
  if (typeof v === 'boolean') return v ? 1 : 0;
  return Number(v);
}

/** POST /api/sweeps answers 201 with this; the sweep is queued. */
export interface SweepCreatedView {
  id: number;
  status: SweepStatus;
  points: number;
}

/** POST /api/sweeps/preview: the server's verdict on a definition before it is submitted. */
export interface SweepPreviewView {
  /** True when the definition is valid and within the user's quota. */
  ok: boolean;
  /** Each with the field's label (`T_e axis · From`) beside the machine path. */
  errors: ErrorDetail[];
  points: number | null;
  chunks: number | null;
  estimate: { seconds: number; kernelPointsPerSecond: number; persistRowsPerSecond: number } | null;
  /** Violations carry the admin's label of each limit. */
  quota: QuotaVerdict | null;
  /** Present when the definition is valid. */
  columns?: SweepColumnView[];
  /** The first point evaluated, when there is one. */
  sample: PointEvaluation | null;
}
