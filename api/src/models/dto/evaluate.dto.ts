import { z } from 'zod';

/**
 * Body of POST /api/models/:id/evaluate. Inputs are numbers in canonical units or unit strings
 * ("10 eV", "1500 G"); ranges and units are checked against the model registry by the service,
 * which knows the model. Thresholds override the model's validity thresholds for this point.
 */
export const evaluateRequestSchema = z
  .object({
    inputs: z
      .record(
        z.string(),
        z.union([z.number(), z.string().trim().min(1, 'must not be empty').max(200)], {
          error: 'must be a number or a string such as "10 eV"',
        }),
      )
      .default({}),
    thresholds: z.record(z.string(), z.number({ error: 'must be a finite number' })).optional(),
  })
  .strict();

export type EvaluateRequest = z.output<typeof evaluateRequestSchema>;
