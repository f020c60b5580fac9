import { z } from 'zod';
import { FIT_MODEL_KINDS } from './types.js';

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
    if ((req.model === 'exponential' || req.model === 'polytropic') && xs.length !== 1) {
      ctx.addIssue({ code: 'custom', path: ['x'], message: `${req.model} takes exactly one x column` });
    }
    if (xs.includes(req.y))
      ctx.addIssue({ code: 'custom', path: ['x'], message: `y column "${req.y}" cannot also be an x column` });
    if (new Set(xs).size !== xs.length)
      ctx.addIssue({ code: 'custom', path: ['x'], message: 'x names a column twice' });
  });

export type FitRequest = z.infer<typeof fitRequestSchema>;
