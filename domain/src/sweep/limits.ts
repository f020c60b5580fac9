/** Hard ceiling on points in one sweep, whatever the quota (quotas are the api's job). */
export const MAX_POINTS_HARD = 50_000_000;
/** Points per chunk (one queue job). Tuned by the 1M-point benchmark; callers may override. */
export const DEFAULT_CHUNK_SIZE = 5000;
export const MAX_AXIS_COUNT = 10_000;
export const MAX_AXES = 16;
export const MAX_RANDOM_SAMPLES = 10_000_000;
export const MAX_DERIVED = 16;
/** Numeric columns one stored result row holds (inputs + outputs + derived; api RESULT_SLOTS). */
export const MAX_STORED_COLUMNS = 64;
export const MAX_TAGS = 20;
