import { z } from 'zod';

/*
 * Sensitivity contracts: GET /api/sweeps/:id/sensitivity?output=<column> on a sweep with the Saltelli
 * design (sampling kind "saltelli"). First-order (Saltelli et al. 2010) and total (Jansen 1999) Sobol
 * indices per swept input with percentile-bootstrap intervals (domain/src/sensitivity).
 */

/** Query: the output or derived column to analyse. Strict, so a misspelt parameter is a 400 naming it. */
export const sensitivityQuerySchema = z
  .object({
    output: z
      .string({ error: 'is required: the output or derived column to analyse' })
      .trim()
      .min(1, 'is required: the output or derived column to analyse')
      .max(64, 'must be at most 64 characters'),
  })
  .strict();
export type SensitivityQuery = z.infer<typeof sensitivityQuerySchema>;

const interval = z.tuple([z.number(), z.number()]);

export const sensitivityIndexSchema = z.object({
  /** The swept input (an axis of the sweep), in axis order. */
  input: z.string(),
  /** First-order index S_i; null when the output does not vary over the sweep. */
  first: z.number().nullable(),
  firstCI: interval.nullable(),
  /** Total index S_Ti; null when the output does not vary. */
  total: z.number().nullable(),
  totalCI: interval.nullable(),
});
export type SensitivityIndex = z.infer<typeof sensitivityIndexSchema>;

export const sensitivityReportSchema = z.object({
  output: z.string(),
  /** Canonical unit of the output ('' for derived columns). */
  unit: z.string(),
  /** Complete sample groups used (N); each group is d + 2 points. */
  n: z.number().int(),
  /** Groups left out: not computed yet, or an output value that is not finite. */
  dropped: z.number().int(),
  /** Sample groups of the design. */
  samples: z.number().int(),
  /** Variance of the output over the A and B points. */
  variance: z.number(),
  indices: z.array(sensitivityIndexSchema),
  /** How the intervals were formed: percentile bootstrap over sample groups (or blocks of them). */
  bootstrap: z.object({
    method: z.literal('percentile'),
    resamples: z.number().int(),
    level: z.number(),
    seed: z.number().int(),
    units: z.number().int(),
  }),
  estimators: z.object({ first: z.string(), total: z.string() }),
});
export type SensitivityReport = z.infer<typeof sensitivityReportSchema>;
