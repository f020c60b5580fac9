import { ACTIVE_STATES } from '@driftgrid/domain';
import { InjectQueue } from '@nestjs/bullmq';
import { Injectable, Logger, type OnApplicationBootstrap } from '@nestjs/common';
import type { JobsOptions, Queue } from 'bullmq';
import { createHash } from 'node:crypto';
import { CHUNK_QUEUE, chunkJobId, type ChunkJobData } from '@driftgrid/worker';
import { SweepsRepository, type SweepRow } from './sweeps.repository.js';

const JOB_OPTIONS: JobsOptions = {
  attempts: 3,
  backoff: { type: 'exponential', delay: 1000 },
  removeOnComplete: true,
  removeOnFail: { count: 1000 },
};

const BULK = 500;

export function definitionHash(definition: string): string {
  return createHash('sha256').update(definition).digest('hex').slice(0, 16);
}

/** Puts chunk jobs on the queue and, at start, re-enqueues whatever SQLite says is unfinished. */
@Injectable()
export class ChunkDispatcher implements OnApplicationBootstrap {
  private readonly logger = new Logger('ChunkDispatcher');

  constructor(
    @InjectQueue(CHUNK_QUEUE) private readonly queue: Queue,
    private readonly sweeps: SweepsRepository,
  ) {}

  async enqueue(sweep: SweepRow, chunkIndexes?: number[]): Promise<number> {
    const definition = JSON.parse(sweep.definition) as unknown;
    const hash = definitionHash(sweep.definition);
    const chunks = this.sweeps
      .chunks(sweep.id, ACTIVE_STATES)
      .filter((c) => !chunkIndexes || chunkIndexes.includes(c.chunkIndex));
    for (let k = 0; k < chunks.length; k += BULK) {
      await this.queue.addBulk(
        chunks.slice(k, k + BULK).map((c) => ({
          name: 'chunk',
          data: {
            sweepId: sweep.id,
            chunkIndex: c.chunkIndex,
            i0: c.i0,
            i1: c.i1,
            definition,
            definitionHash: hash,
            modelVersion: sweep.modelVersion,
          } satisfies ChunkJobData,
          // Same id for the same chunk: re-enqueueing a chunk still on a real Redis is a no-op.
          opts: { ...JOB_OPTIONS, jobId: chunkJobId(sweep.id, c.chunkIndex) },
        })),
      );
    }
    return chunks.length;
  }

  /** Removes a sweep's chunk jobs that have not started; running ones finish and are ignored. */
  async withdraw(sweepId: number, chunkIndexes: number[]): Promise<void> {
    await Promise.all(chunkIndexes.map((i) => this.queue.remove(chunkJobId(sweepId, i)).catch(() => 0)));
  }

  async onApplicationBootstrap(): Promise<void> {
    let n = 0;
    for (const s of this.sweeps.unfinished()) n += await this.enqueue(s);
    if (n) this.logger.log(`Re-enqueued ${n} unfinished chunks`);
  }

  counts() {
    return this.queue.getJobCounts('waiting', 'active', 'delayed', 'failed', 'completed', 'prioritized');
  }

  pause() {
    return this.queue.pause();
  }

  resume() {
    return this.queue.resume();
  }

  isPaused() {
    return this.queue.isPaused();
  }
}
