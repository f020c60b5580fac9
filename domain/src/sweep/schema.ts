import { z } from 'zod';
import { safeName } from '../contracts/text-safety.js';
import { MAX_AXES, MAX_AXIS_COUNT, MAX_DERIVED, MAX_POINTS_HARD, MAX_RANDOM_SAMPLES, MAX_TAGS } from './limits.js';
import { MAX_SALTELLI_DIMENSIONS, saltelliGroupSize } from './sampling/saltelli.js';

/**
 * The sweep definition (SPEC §4), shared by api validation and the ui form. Structural checks only;
 * compileSweep adds the checks that need the model (names, ranges, expressions).
 */

const IDENT = /^[A-Za-z_][A-Za-z0-9_]*$/;
const TAG = /^[a-z0-9_ -]+$/;

/** A number in canonical units, or a string: a value with units ("3 cm") or an expression ("2*Te_eV"). */
export const quantitySchema = z.union(
  [
    z.number({ error: 'must be a finite number' }),
    z.string().trim().min(1, 'must not be empty').max(200, 'must be at most 200 characters'),
  ],
  { error: 'must be a number or a string such as "20 eV"' },
);

const paramSchema = z.string({ error: 'must be an input name' }).regex(IDENT, 'must be an input name such as Te_eV');
const unitSchema = z.string().trim().min(1).max(40, 'must be at most 40 characters').optional();
const countSchema = z
  .number({ error: 'must be a whole number' })
  .int('must be a whole number')
  .min(1, 'must be at least 1')
  .max(MAX_AXIS_COUNT, `must be at most ${MAX_AXIS_COUNT}`);

export const linearAxisSchema = z.object({
  kind: z.literal('linear'),
  param: paramSchema,
  min: quantitySchema,
  max: quantitySchema,
  /** Points along the axis for grid sampling (endpoints included); ignored by random designs. */
  count: countSchema.optional(),
  /** Unit of numeric min/max (e.g. "cm"); without it numbers are canonical. */
  unit: unitSchema,
});

export const logAxisSchema = z.object({
  kind: z.literal('log'),
  param: paramSchema,
  min: quantitySchema,
  max: quantitySchema,
  count: countSchema.optional(),
  unit: unitSchema,
});

export const listAxisSchema = z.object({
  kind: z.literal('list'),
  param: paramSchema,
  values: z
    .array(quantitySchema, { error: 'must be a list of values' })
    .min(1, 'must hold at least one value')
    .max(MAX_AXIS_COUNT, `must hold at most ${MAX_AXIS_COUNT} values`),
  unit: unitSchema,
});

export const axisSchema = z.discriminatedUnion('kind', [linearAxisSchema, logAxisSchema, listAxisSchema], {
  error: 'kind must be one of linear, log, list',
});

const samplesSchema = z
  .number({ error: 'must be a whole number' })
  .int('must be a whole number')
  .min(1, 'must be at least 1')
  .max(MAX_RANDOM_SAMPLES, `must be at most ${MAX_RANDOM_SAMPLES}`);

export const samplingSchema = z.discriminatedUnion(
  'kind',
  [
    z.object({ kind: z.literal('grid') }),
    z.object({
      kind: z.literal('latin-hypercube'),
      samples: samplesSchema,
      seed: z
        .number({ error: 'must be a whole number' })
        .int('must be a whole number')
        .min(0, 'must be at least 0')
        .max(Number.MAX_SAFE_INTEGER, 'must be a safe integer'),
    }),
    z.object({
      kind: z.literal('sobol'),
      samples: samplesSchema,
      /** Leading points of the sequence to skip (default 0: the sequence starts at the origin). */
      skip: z
        .number({ error: 'must be a whole number' })
        .int('must be a whole number')
        .min(0, 'must be at least 0')
        .max(2 ** 31, `must be at most ${2 ** 31}`)
        .optional(),
    }),
    z.object({
      kind: z.literal('saltelli'),
      /** Sample groups N; the design runs N·(d + 2) points (d = number of axes). Powers of 2 balance best. */
      samples: samplesSchema,
    }),
  ],
  { error: 'kind must be one of grid, latin-hypercube, sobol, saltelli' },
);

export const derivedSchema = z.object({
  name: z
    .string({ error: 'must be a name' })
    .regex(IDENT, 'must be an identifier (letters, digits, _; not starting with a digit)')
    .max(64, 'must be at most 64 characters'),
  expr: z
    .string({ error: 'must be an expression' })
    .trim()
    .min(1, 'must not be empty')
    .max(500, 'must be at most 500 characters'),
});

export const sweepDefinitionSchema = z
  .object({
    schemaVersion: z.literal(1, { error: 'must be 1' }).default(1),
    name: safeName(
      z.string({ error: 'is required' }).trim().min(1, 'must not be empty').max(200, 'must be at most 200 characters'),
    ),
    model: z.string({ error: 'is required' }).min(1, 'must name a model'),
    description: z.string().max(5000, 'must be at most 5000 characters').optional(),
    fixed: z.record(paramSchema, quantitySchema).default({}),
    axes: z
      .array(axisSchema, { error: 'must be a list of axes' })
      .min(1, 'must hold at least one axis')
      .max(MAX_AXES, `must hold at most ${MAX_AXES} axes`),
    sampling: samplingSchema.default({ kind: 'grid' }),
    derived: z.array(derivedSchema).max(MAX_DERIVED, `must hold at most ${MAX_DERIVED} columns`).default([]),
    tags: z
      .array(
        z
          .string()
          .trim()
          .min(1, 'must not be empty')
          .max(40, 'must be at most 40 characters')
          .regex(TAG, 'may hold only a-z, 0-9, -, _ and spaces'),
      )
      .max(MAX_TAGS, `must hold at most ${MAX_TAGS} tags`)
      .default([]),
    thresholds: z.record(z.string(), z.number({ error: 'must be a finite number' })).optional(),
    visibility: z.enum(['private', 'group'], { error: 'must be private or group' }).optional(),
  })
  .superRefine((def, ctx) => {
    if (def.sampling.kind === 'grid') {
      let points = 1;
      def.axes.forEach((axis, i) => {
        if (axis.kind === 'list') points *= axis.values.length;
        else if (axis.count === undefined) {
          ctx.addIssue({ code: 'custom', path: ['axes', i, 'count'], message: 'is required for grid sampling' });
        } else points *= axis.count;
      });
      if (points > MAX_POINTS_HARD) {
        ctx.addIssue({
          code: 'custom',
          path: ['axes'],
          message: `the grid has ${points.toLocaleString('en-US')} points; at most ${MAX_POINTS_HARD.toLocaleString('en-US')} are allowed`,
        });
      }
    }
    if (def.sampling.kind === 'saltelli') {
      const points = def.sampling.samples * saltelliGroupSize(def.axes.length);
      if (points > MAX_POINTS_HARD) {
        ctx.addIssue({
          code: 'custom',
          path: ['sampling', 'samples'],
          message: `${def.sampling.samples.toLocaleString('en-US')} samples × (${def.axes.length} axes + 2) make ${points.toLocaleString('en-US')} points; at most ${MAX_POINTS_HARD.toLocaleString('en-US')} are allowed`,
        });
      }
      if (def.axes.length > MAX_SALTELLI_DIMENSIONS) {
        ctx.addIssue({
          code: 'custom',
          path: ['axes'],
          message: `the Saltelli design covers at most ${MAX_SALTELLI_DIMENSIONS} axes`,
        });
      }
    }
    const names = new Set<string>();
    def.derived.forEach((d, i) => {
      if (names.has(d.name))
        ctx.addIssue({ code: 'custom', path: ['derived', i, 'name'], message: `duplicates derived column ${d.name}` });
      names.add(d.name);
    });
  });

/** A definition as written (defaults optional). */
export type SweepDefinitionInput = z.input<typeof sweepDefinitionSchema>;
/** A definition after parsing (defaults filled). */
export type SweepDefinition = z.output<typeof sweepDefinitionSchema>;
export type SweepAxis = z.output<typeof axisSchema>;
export type SweepSampling = z.output<typeof samplingSchema>;
export type SweepDerived = z.output<typeof derivedSchema>;
