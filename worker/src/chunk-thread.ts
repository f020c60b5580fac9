import { parentPort } from 'node:worker_threads';
import type { ChunkJobData } from './chunk-job.js';
import { computeChunk } from './compute-chunk.js';
import { lowerThreadPriority } from './thread-priority.js';

// Compute yields the cores to the api's request thread and to read threads (thread-priority.ts).
lowerThreadPriority('compute');

/** Thread entry: computes chunks off the main event loop and transfers the arrays back without copying. */
parentPort!.on('message', (msg: { id: number; data: ChunkJobData }) => {
  try {
    const r = computeChunk(msg.data);
    const transfer = [...Object.values(r.columns).map((a) => a.buffer), r.flags.buffer] as ArrayBuffer[];
    parentPort!.postMessage({ id: msg.id, ok: true, result: r }, transfer);
  } catch (e) {
    const err = e as Error & { details?: unknown };
    parentPort!.postMessage({
      id: msg.id,
      ok: false,
      error: { name: err.name, message: err.message, details: err.details },
    });
  }
});
