import { ACTIVE_STATES } from './sweeps.js';
import { z } from 'zod';
import { FIT_MODEL_KINDS, type FitAdvice, type FitModelKind, type SigmaMode } from '../fit/types.js';

/* ---------- fits (SPEC §6, issue 15): the request, and the fit as the api shows it ---------- */

const paramName = z
  .string()
  .min(1, 'a parameter name must not be empty')
  .max(64, 'a parameter name has at most 64 characters');
const finiteNumber = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, `${what} must be finite`);

/** `[lo, hi]`; null leaves that side open (JSON has no ∞). */
const boundPair = z
  .tuple([z.number().nullable(), z.number().nullable()], {
    error: 'a bound is [lowest, highest]; null leaves a side open',
  })
  .refine(([lo, hi]) => lo !== null || hi !== null, 'a bound needs a lowest or a highest value')
  .refine(([lo, hi]) => lo === null || hi === null || lo < hi, 'the lowest value must be below the highest');

/** The probe's collecting area and ion species, for the density from the ion saturation current. */
export const probeSchema = z
  .object(
    {
      area_m2: z
        .number({ error: 'probe.area_m2 (collecting area) must be a number in m²' })
        .positive('probe.area_m2 (collecting area) must be > 0 m²')
        .max(1, 'probe.area_m2 (collecting area) is at most 1 m²'),
      mu: z
        .number({ error: 'probe.mu (ion mass in proton masses) must be a number' })
        .min(1e-3, 'probe.mu (ion mass in proton masses) must be at least 0.001')
        .max(1000, 'probe.mu (ion mass in proton masses) is at most 1000'),
      h: z
        .number({ error: 'probe.h (sheath-edge density factor) must be a number' })
        .gt(0, 'probe.h (sheath-edge density factor) must be > 0')
        .max(1, 'probe.h (sheath-edge density factor) is at most 1')
        .optional(),
    },
    { error: 'probe must be { area_m2, mu, h? }' },
  )
  .strict();
export type ProbeSpec = z.infer<typeof probeSchema>;

const columnName = z
  .string({ error: 'must be a column name (a string)' })
  .min(1, 'a column name must not be empty')
  .max(200, 'a column name has at most 200 characters');

const filterCondition = z
  .object(
    {
      gte: z.number().optional(),
      lte: z.number().optional(),
      gt: z.number().optional(),
      lt: z.number().optional(),
      eq: z.union([z.number(), z.boolean(), z.string()]).optional(),
    },
    { error: 'a filter condition is an object such as { "gte": 1, "lte": 10 }' },
  )
  .strict()
  .refine((c) => Object.keys(c).length > 0, 'a filter condition needs at least one of gte, lte, gt, lt, eq');

/** Body of POST /api/fits (SPEC §6). */
export const fitRequestSchema = z
  .object({
    source: z.object(
      {
        kind: z.enum(['sweep', 'dataset'], { error: 'source.kind must be "sweep" or "dataset"' }),
        id: z.string({ error: 'source.id must be a string' }).min(1, 'source.id must not be empty'),
      },
      { error: 'source must be { kind: "sweep" | "dataset", id }' },
    ),
    model: z.enum(FIT_MODEL_KINDS as [string, ...string[]], {
      error: `model must be one of ${FIT_MODEL_KINDS.join(', ')}`,
    }) as z.ZodType<(typeof FIT_MODEL_KINDS)[number]>,
    y: columnName,
    x: z.union(
      [columnName, z.array(columnName).min(1, 'x needs at least one column').max(20, 'x takes at most 20 columns')],
      {
        error: 'x must be a column name or a list of column names',
      },
    ),
    expr: z.string().min(1, 'expr must not be empty').max(2000, 'expr has at most 2000 characters').optional(),
    params: z
      .record(
        z.string().min(1),
        z.number({ error: 'a start value must be a number' }).refine(Number.isFinite, 'a start value must be finite'),
      )
      .optional(),
    filter: z.record(z.string().min(1), filterCondition).optional(),
    weights: columnName.optional(),
    maxIterations: z.number().int('maxIterations must be an integer').min(1).max(100_000).optional(),
    fixed: z.record(paramName, finiteNumber('a fixed value')).optional(),
    bounds: z.record(paramName, boundPair).optional(),
    sigmaMode: z.enum(['absolute', 'relative'], { error: 'sigmaMode must be "absolute" or "relative"' }).optional(),
    normalised: z.boolean({ error: 'normalised must be true or false' }).optional(),
    range: z
      .tuple([finiteNumber('the lowest voltage'), finiteNumber('the highest voltage')], {
        error: 'range must be [lowest V, highest V]',
      })
      .refine(([lo, hi]) => lo < hi, 'range: the lowest voltage must be below the highest')
      .optional(),
    sheathSlope: z.boolean({ error: 'sheathSlope must be true or false' }).optional(),
    probe: probeSchema.optional(),
  })
  .strict()
  .superRefine((req, ctx) => {
    if (req.model === 'expression') {
      if (!req.expr)
        ctx.addIssue({ code: 'custom', path: ['expr'], message: 'expr is required when model is "expression"' });
      if (!req.params || Object.keys(req.params).length === 0) {
        ctx.addIssue({
          code: 'custom',
          path: ['params'],
          message: 'params (start values) are required when model is "expression"',
        });
      }
    } else if (req.expr !== undefined) {
      ctx.addIssue({
        code: 'custom',
        path: ['expr'],
        message: `expr is only used with model "expression", not "${req.model}"`,
      });
    }
    const xs = Array.isArray(req.x) ? req.x : [req.x];
    const probeModel = req.model === 'probe-retarding' || req.model === 'probe-double';
    if (req.sigmaMode !== undefined && !req.weights)
      ctx.addIssue({
        code: 'custom',
        path: ['sigmaMode'],
        message: 'sigmaMode needs a σ column in weights (absolute or relative to what?)',
      });
    if (req.normalised !== undefined && req.model !== 'polytropic')
      ctx.addIssue({
        code: 'custom',
        path: ['normalised'],
        message: 'normalised applies to the polytropic model only',
      });
    if (req.range !== undefined && req.model !== 'probe-retarding')
      ctx.addIssue({ code: 'custom', path: ['range'], message: 'range applies to the probe-retarding model only' });
    if (req.sheathSlope !== undefined && !probeModel)
      ctx.addIssue({ code: 'custom', path: ['sheathSlope'], message: 'sheathSlope applies to the probe models only' });
    if (req.probe !== undefined && !probeModel)
      ctx.addIssue({
        code: 'custom',
        path: ['probe'],
        message: 'probe (area, ion mass) applies to the probe models only',
      });
    for (const name of Object.keys(req.fixed ?? {}))
      if (req.bounds?.[name] !== undefined)
        ctx.addIssue({
          code: 'custom',
          path: ['fixed', name],
          message: `${name} is either fixed or bounded, not both`,
        });
    if ((req.model === 'exponential' || req.model === 'polytropic' || probeModel) && xs.length !== 1) {
      ctx.addIssue({ code: 'custom', path: ['x'], message: `${req.model} takes exactly one x column` });
    }
    if (xs.includes(req.y))
      ctx.addIssue({ code: 'custom', path: ['x'], message: `y column "${req.y}" cannot also be an x column` });
    if (new Set(xs).size !== xs.length)
      ctx.addIssue({ code: 'custom', path: ['x'], message: 'x names a column twice' });
  });

export type FitRequest = z.infer<typeof fitRequestSchema>;

export type FitSourceKind = 'sweep' | 'dataset';
export const FIT_STATUSES = [...ACTIVE_STATES, 'completed', 'failed'] as const;
export type FitStatus = (typeof FIT_STATUSES)[number];
export const LIVE_FIT_STATUSES: readonly FitStatus[] = ACTIVE_STATES;
export type { FitModelKind, SigmaMode };

/** Shapes of a stored fit shared by the api (which writes them) and the ui (which shows them). */
export interface FitParameterView {
  name: string;
  value: number | null;
  stdError: number | null;
  /** Unit where the model makes it plain (exponents '1', Te in eV, n0 and A in y's unit, probe currents in A). */
  unit: string | null;
  ci95: { low: number; high: number } | null;
  /** Held at its value by the request: stdError 0. */
  fixed: boolean;
}

/** A quantity computed from the fitted parameters, its error propagated from the covariance (delta method). */
export interface FitDerivedView {
  name: string;
  value: number | null;
  stdError: number | null;
  unit: string;
  /** How it was computed, in words. */
  method: string;
}

/** Down-sampled data for the data/fit and residual plots. */
export interface FitPlotData {
  xNames: string[];
  x: Record<string, (number | null)[]>;
  y: (number | null)[];
  fitted: (number | null)[];
  residuals: (number | null)[];
  /** Points in the fit, and points in these arrays. */
  total: number;
  shown: number;
}

/** What a finished (or non-converged) fit stores and shows. */
export interface FitOutcomeView {
  parameters: FitParameterView[];
  confidence: { level: number; method: string; t: number | null; dof: number };
  rss: number | null;
  r2: number | null;
  rmse: number | null;
  residualSd: number | null;
  chi2red?: number | null;
  chi2?: number | null;
  chi2PValue?: number | null;
  /** Present when σ was given: which covariance was used. */
  sigmaMode?: SigmaMode;
  aic: number | null;
  bic: number | null;
  /** Parameter correlations in parameter order; null where undefined (a fixed parameter). */
  correlation: (number | null)[][];
  derived: FitDerivedView[];
  /** Probe-retarding: the voltage window fitted, and whether it was chosen automatically. */
  region?: { vMin: number; vMax: number; automatic: boolean; used: number; of: number };
  advice?: FitAdvice;
  dof: number;
  n: number;
  dropped: number;
  iterations: number;
  converged: boolean;
  message: string;
  /** Power law on all-negative y: fitted |y|, then C carries the sign back. */
  signRestored: boolean;
  covariance: (number | null)[][];
  /** Canonical units of the columns used (y, x, weights), for labels. */
  units: Record<string, string>;
  plot: FitPlotData;
}

/** GET /api/fits/:id (and list items without plot and covariance). */
export interface FitView extends Partial<Omit<FitOutcomeView, 'plot' | 'covariance'>> {
  id: number;
  status: FitStatus;
  progress: number;
  model: FitModelKind;
  source: { kind: FitSourceKind; id: number; name: string | null };
  y: string;
  x: string | string[];
  request: FitRequest & { source: { kind: FitSourceKind; id: number } };
  plot?: FitPlotData;
  covariance?: (number | null)[][];
  error: string | null;
  modelVersion: string | null;
  appVersion: string;
  owner: { id: number; name: string };
  createdAt: string;
  finishedAt: string | null;
}

/** POST /api/fits answers 202 with this for a long fit. */
export interface FitQueuedView {
  id: number;
  status: 'queued';
  progress: number;
  n: number;
  dropped: number;
}

export type FitCreatedView = FitView | FitQueuedView;

/** The POST /api/fits body as a client sends it: the request with the source id as a number. */
export type FitRequestBody = Omit<FitRequest, 'source'> & { source: { kind: FitSourceKind; id: number } };
