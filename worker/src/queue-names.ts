/** The chunk jobs: one per slice [i0, i1) of a sweep. */
export const CHUNK_QUEUE = 'sweep-chunks';
/** Chunk results travel back to the api through this queue; only the api consumes it (it owns SQLite). */
export const RESULT_QUEUE = 'sweep-results';

/** Key prefix of every queue; a deployment (or a test run) sharing a Redis picks its own. */
export const DEFAULT_QUEUE_PREFIX = 'dg';
