import { compileSweep, ValidationError, type CompiledSweep } from '@driftgrid/domain';
import type { ChunkJobData } from './chunk-job.js';

export interface ComputedChunk {
  n: number;
  columns: Record<string, Float64Array>;
  flags: Uint32Array;
  computeMs: number;
}

// Compiling a definition parses expressions and resolves axes; do it once per sweep per thread.
const cache = new Map<string, CompiledSweep>();
const CACHE_LIMIT = 16;

function compiled(data: ChunkJobData): CompiledSweep {
  const key = `${data.sweepId}:${data.definitionHash}`;
  let c = cache.get(key);
  if (!c) {
    c = compileSweep(data.definition);
    assertSameModelVersion(c, data);
    if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value as string);
    cache.set(key, c);
  }
  return c;
}

/**
 * A sweep stores its model version and a column layout made for it; computing it with a newer model
 * (an upgrade while chunks were queued, or a standalone worker on another release) would mix versions
 * in one table. Refuse with a reason the owner can act on; the sweep fails instead of being corrupted.
 */
function assertSameModelVersion(c: CompiledSweep, data: ChunkJobData): void {
  if (data.modelVersion === undefined || c.model.version === data.modelVersion) return;
  const message =
    `The sweep was created with ${c.model.id} version ${data.modelVersion}, but this worker computes version ` +
    `${c.model.version}. Submit the definition again to compute it with the current model.`;
  throw new ValidationError(message, [{ path: 'model', label: 'Model version', message }]);
}

/** Evaluates the chunk [i0, i1) of a sweep: pure computation, no I/O. */
export function computeChunk(data: ChunkJobData): ComputedChunk {
  const started = performance.now();
  const out = compiled(data).evaluateChunk(data.i0, data.i1);
  return { n: out.n, columns: out.columns, flags: out.flags, computeMs: performance.now() - started };
}
