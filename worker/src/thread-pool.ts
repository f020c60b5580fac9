import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { ChunkJobData } from './chunk-job.js';
import { computeChunk, type ComputedChunk } from './compute-chunk.js';

type Pending = { resolve: (r: ComputedChunk) => void; reject: (e: Error) => void };

// The thread entry must be JavaScript; tests run from source, so fall back to the built file.
function threadEntry(): string {
  const here = path.dirname(fileURLToPath(import.meta.url));
  const sibling = path.join(here, 'chunk-thread.js');
  if (fs.existsSync(sibling)) return sibling;
  return path.resolve(here, '../dist/chunk-thread.js');
}

export class ChunkComputeError extends Error {
  constructor(
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.name = 'ChunkComputeError';
  }
}

/**
 * A fixed pool of worker threads that compute chunks, so neither the api's nor a worker's event loop
 * blocks on physics. size 0 computes inline (for tests and tiny deployments).
 */
export class ChunkThreadPool {
  private readonly threads: { worker: Worker; busy: number }[] = [];
  private readonly pending = new Map<number, Pending>();
  private nextId = 1;
  private closed = false;

  constructor(readonly size: number) {
    for (let i = 0; i < size; i++) this.spawn();
  }

  private spawn(): void {
    const worker = new Worker(threadEntry());
    const slot = { worker, busy: 0 };
    worker.on(
      'message',
      (msg: { id: number; ok: boolean; result?: ComputedChunk; error?: { message: string; details?: unknown } }) => {
        slot.busy--;
        const p = this.pending.get(msg.id);
        if (!p) return;
        this.pending.delete(msg.id);
        if (msg.ok) p.resolve(msg.result!);
        else p.reject(new ChunkComputeError(msg.error!.message, msg.error!.details));
      },
    );
    worker.on('error', (e) => {
      // A crashed thread fails the jobs it held (BullMQ retries them) and is replaced.
      for (const [id, p] of this.pending) {
        if ((p as Pending & { thread?: Worker }).thread === worker) {
          this.pending.delete(id);
          p.reject(e);
        }
      }
      const idx = this.threads.indexOf(slot);
      if (idx >= 0) this.threads.splice(idx, 1);
      if (!this.closed) this.spawn();
    });
    worker.unref();
    this.threads.push(slot);
  }

  run(data: ChunkJobData): Promise<ComputedChunk> {
    if (this.closed) return Promise.reject(new Error('thread pool is closed'));
    if (this.size === 0) {
      try {
        return Promise.resolve(computeChunk(data));
      } catch (e) {
        return Promise.reject(e as Error);
      }
    }
    const slot = this.threads.reduce((a, b) => (b.busy < a.busy ? b : a));
    slot.busy++;
    const id = this.nextId++;
    return new Promise<ComputedChunk>((resolve, reject) => {
      this.pending.set(id, Object.assign({ resolve, reject }, { thread: slot.worker }));
      slot.worker.postMessage({ id, data });
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    await Promise.all(this.threads.map((t) => t.worker.terminate()));
    this.threads.length = 0;
    for (const p of this.pending.values()) p.reject(new Error('thread pool closed'));
    this.pending.clear();
  }
}
