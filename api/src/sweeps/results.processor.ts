import { ACTIVE_STATES } from '@driftgrid/domain';
import { Processor, WorkerHost } from '@nestjs/bullmq';
import { Logger } from '@nestjs/common';
import type { Job } from 'bullmq';
import { QUEUE_LOCK_TIMING, RESULT_QUEUE, ResultTransport, type ChunkResultPayload } from '@driftgrid/worker';
import { ChunkDispatcher } from './chunk-dispatcher.js';
import { SweepPersistence, type ChunkFailure } from './sweep-persistence.service.js';
import { SweepsRepository } from './sweeps.repository.js';

/** Storage errors that retrying will not cure: the sweep fails with a reason instead of hanging. */
const FINAL_STORAGE_ERRORS: Record<string, string> = {
  SQLITE_FULL: 'the database is full (no space left for results); free disk space and run the sweep again',
  SQLITE_READONLY: 'the database is read-only; check DATA_DIR permissions and run the sweep again',
  SQLITE_CORRUPT: 'the database reported corruption; restore from a backup',
};

/** The api is the only consumer of the results queue: it alone writes SQLite. */
@Processor(RESULT_QUEUE, { concurrency: 1, ...QUEUE_LOCK_TIMING })
export class ResultsProcessor extends WorkerHost {
  private readonly logger = new Logger('ResultsProcessor');

  constructor(
    private readonly persistence: SweepPersistence,
    private readonly dispatcher: ChunkDispatcher,
    private readonly sweeps: SweepsRepository,
    private readonly transport: ResultTransport,
  ) {
    super();
  }

  async process(job: Job<ChunkResultPayload | ChunkFailure>): Promise<string> {
    // The in-memory Redis answers through microtasks only; without a macrotask break between
    // chunks, back-to-back persists would starve HTTP requests for the whole sweep.
    await new Promise((resolve) => setImmediate(resolve));
    if (job.name === 'chunk-failed') {
      const f = job.data as ChunkFailure;
      this.persistence.fail(f);
      await this.withdrawRest(f.sweepId);
      return 'failed';
    }
    const p = this.transport.receive(job.data);
    if (!p) {
      // The payload is gone (cannot happen short of a bug): compute the chunk again.
      const { sweepId, chunkIndex } = job.data as { sweepId: number; chunkIndex: number };
      const sweep = this.sweeps.findById(sweepId);
      if (sweep) await this.dispatcher.enqueue(sweep, [chunkIndex]);
      return 'requeued';
    }
    try {
      return await this.persistence.persist(p);
    } catch (e) {
      const code = (e as { code?: string }).code ?? '';
      const reason = FINAL_STORAGE_ERRORS[code];
      if (!reason) throw e; // transient: the results queue retries with backoff
      this.logger.error(`sweep ${p.sweepId}: ${code} while storing chunk ${p.chunkIndex}`);
      this.persistence.fail({ sweepId: p.sweepId, chunkIndex: p.chunkIndex, reason, workerId: p.workerId });
      await this.withdrawRest(p.sweepId);
      return 'failed';
    }
  }

  /** Once a sweep has failed, its chunks still waiting are removed so no worker computes them. */
  private async withdrawRest(sweepId: number): Promise<void> {
    const open = this.sweeps.chunks(sweepId, ACTIVE_STATES).map((c) => c.chunkIndex);
    if (open.length) await this.dispatcher.withdraw(sweepId, open);
  }
}
