import { Processor, WorkerHost } from '@nestjs/bullmq';
import type { Job } from 'bullmq';
import { RESULT_QUEUE, type ChunkResultPayload } from '@driftgrid/worker';
import { SweepPersistence, type ChunkFailure } from './sweep-persistence.service.js';

/** The api is the only consumer of the results queue: it alone writes SQLite. */
@Processor(RESULT_QUEUE, { concurrency: 1 })
export class ResultsProcessor extends WorkerHost {
  constructor(private readonly persistence: SweepPersistence) {
    super();
  }

  async process(job: Job<ChunkResultPayload | ChunkFailure>): Promise<string> {
    // The in-memory Redis answers through microtasks only; without a macrotask break between
    // chunks, back-to-back persists would starve HTTP requests for the whole sweep.
    await new Promise((resolve) => setImmediate(resolve));
    if (job.name === 'chunk-failed') {
      this.persistence.fail(job.data as ChunkFailure);
      return 'failed';
    }
    return this.persistence.persist(job.data as ChunkResultPayload);
  }
}
