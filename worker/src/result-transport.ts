import type { ChunkResultPayload } from './chunk-job.js';

/**
 * How a computed chunk travels from the processor to the api. Through Redis the payload rides in
 * the results job itself (typed arrays as base64). In embedded mode processor and api share one
 * process, so the job carries only a reference and the arrays move without encoding or copies.
 */
export abstract class ResultTransport {
  /** Whether column arrays may stay as Float64Array (no base64) on this transport. */
  abstract readonly binary: boolean;
  /** What goes into the results job for this payload. */
  abstract send(payload: ChunkResultPayload): unknown;
  /** The payload a results job stands for, or null when it is gone (then the chunk is recomputed). */
  abstract receive(jobData: unknown): ChunkResultPayload | null;
}

export class InlineResultTransport extends ResultTransport {
  readonly binary = false;
  send(payload: ChunkResultPayload): unknown {
    return payload;
  }
  receive(jobData: unknown): ChunkResultPayload | null {
    return jobData as ChunkResultPayload;
  }
}

interface Ref {
  ref: string;
  sweepId: number;
  chunkIndex: number;
}

export class InProcessResultTransport extends ResultTransport {
  readonly binary = true;
  private readonly held = new Map<string, ChunkResultPayload>();
  private seq = 0;

  send(payload: ChunkResultPayload): Ref {
    const ref = `${payload.sweepId}:${payload.chunkIndex}:${++this.seq}`;
    this.held.set(ref, payload);
    return { ref, sweepId: payload.sweepId, chunkIndex: payload.chunkIndex };
  }

  receive(jobData: unknown): ChunkResultPayload | null {
    const d = jobData as Partial<Ref> & Partial<ChunkResultPayload>;
    if (typeof d.ref !== 'string') return d as ChunkResultPayload;
    const p = this.held.get(d.ref) ?? null;
    this.held.delete(d.ref);
    return p;
  }

  /** Payloads waiting for the api (for tests and diagnostics). */
  get size(): number {
    return this.held.size;
  }
}
