/** The chunk jobs: one per slice [i0, i1) of a sweep. */
export const CHUNK_QUEUE = 'sweep-chunks';
/** Chunk results travel back to the api through this queue; only the api consumes it (it owns SQLite). */
export const RESULT_QUEUE = 'sweep-results';

/** Key prefix of every queue; a deployment (or a test run) sharing a Redis picks its own. */
export const DEFAULT_QUEUE_PREFIX = 'dg';

/**
 * Lock and stalled-check timing of every queue consumer (chunk workers and the api's results
 * consumer). A consumer that dies (kill -9, a lost machine) holds its jobs until their lock lapses;
 * the next stalled check of any live consumer then gives them back. BullMQ's defaults (30 s each) made
 * that 30–60 s; these make it at most ~12 s. Locks are renewed every lockDuration / 2 from the event
 * loop, which compute never holds for long (chunks run on threads). A lock lost to a stalled event
 * loop costs a recomputation, never a double count: persisting a chunk is idempotent. A chunk given
 * back more than maxStalledCount times fails like any other error (and is retried by its attempts).
 */
export const QUEUE_LOCK_TIMING = { lockDuration: 8000, stalledInterval: 4000, maxStalledCount: 3 } as const;
