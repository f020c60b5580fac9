import { DEFAULT_CHUNK_SIZE } from './limits.js';

export interface ChunkPlan {
  /** Chunk number, 0-based. */
  index: number;
  /** First point (inclusive). */
  i0: number;
  /** End point (exclusive). */
  i1: number;
}

/** Split [0, totalPoints) into consecutive chunks of at most `chunkSize` points. */
export function planChunks(totalPoints: number, chunkSize: number = DEFAULT_CHUNK_SIZE): ChunkPlan[] {
  if (!Number.isSafeInteger(totalPoints) || totalPoints < 0)
    throw new RangeError(`totalPoints ${totalPoints} must be a whole number ≥ 0`);
  if (!Number.isSafeInteger(chunkSize) || chunkSize < 1)
    throw new RangeError(`chunkSize ${chunkSize} must be a whole number ≥ 1`);
  const chunks: ChunkPlan[] = [];
  for (let i0 = 0, index = 0; i0 < totalPoints; i0 += chunkSize, index++) {
    chunks.push({ index, i0, i1: Math.min(totalPoints, i0 + chunkSize) });
  }
  return chunks;
}

/** Number of chunks planChunks would return, without building them. */
export function chunkCount(totalPoints: number, chunkSize: number = DEFAULT_CHUNK_SIZE): number {
  return Math.ceil(totalPoints / chunkSize);
}
