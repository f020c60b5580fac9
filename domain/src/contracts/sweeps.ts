import { z } from 'zod';

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
