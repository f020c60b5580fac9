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

/** Every state a sweep can be in; the api's table column and the ui's badges take this list. */
export const SWEEP_STATUSES = ['draft', 'queued', 'running', 'completed', 'failed', 'cancelled', 'archived'] as const;
export type SweepStatus = (typeof SWEEP_STATUSES)[number];

/**
 * States in which work is still pending or under way — for sweeps, their chunks and fits alike:
 * what cancelling stops, what the quota counts as running, and what the ui keeps polling.
 */
export const ACTIVE_STATES = ['queued', 'running'] as const;
export type ActiveState = (typeof ACTIVE_STATES)[number];

/** True for a status in ACTIVE_STATES (takes any string: statuses arrive as text from the api). */
export function isActiveState(status: string): status is ActiveState {
  return (ACTIVE_STATES as readonly string[]).includes(status);
}
