import { chunkCount } from './chunks.js';
import type { CompiledSweep } from './compile.js';
import { DEFAULT_CHUNK_SIZE } from './limits.js';

export interface SweepEstimate {
  points: number;
  chunks: number;
  /** Compute time at the given kernel speed (no queue or persistence overhead). */
  seconds: number;
}

/** Points, chunks and a compute-time estimate from a measured kernel speed (points per second). */
export function estimateSweep(
  compiled: Pick<CompiledSweep, 'totalPoints'>,
  pointsPerSecond: number,
  chunkSize = DEFAULT_CHUNK_SIZE,
): SweepEstimate {
  if (!(pointsPerSecond > 0)) throw new RangeError(`pointsPerSecond ${pointsPerSecond} must be > 0`);
  const points = compiled.totalPoints;
  return { points, chunks: chunkCount(points, chunkSize), seconds: points / pointsPerSecond };
}
