import { InjectQueue, OnWorkerEvent, Processor, WorkerHost } from '@nestjs/bullmq';
import { Inject, Logger, type OnApplicationBootstrap, type OnModuleDestroy } from '@nestjs/common';
import { DomainError } from '@driftgrid/domain';
import { UnrecoverableError, type Job, type Queue } from 'bullmq';
import { encodeFloat64, encodeUint32 } from './chunk-codec.js';
import { chunkJobId, type ChunkJobData, type ChunkResultPayload } from './chunk-job.js';
import { CHUNK_QUEUE, QUEUE_LOCK_TIMING, RESULT_QUEUE } from './queue-names.js';
import { ChunkComputeError, ChunkThreadPool } from './thread-pool.js';
import { InlineResultTransport, type ResultTransport } from './result-transport.js';

export interface ChunkRuntimeOptions {
  /** Chunks fetched at once from the queue. */
  concurrency: number;
  /** Compute threads (0 = inline). */
  threads: number;
  /** `hostname:pid`, recorded in provenance. */
  workerId: string;
  /** How results reach the api (default: inside the results job). */
  transport?: ResultTransport;
}

export const CHUNK_RUNTIME_OPTIONS = Symbol('CHUNK_RUNTIME_OPTIONS');

/**
 * Results waiting for the api beyond which a worker holds its finished chunk back. Compute outruns
 * SQLite inserts by an order of magnitude; without this the backlog of encoded chunks would grow
 * with the sweep (in the api's memory in embedded mode, in Redis otherwise).
 */
export const MAX_RESULT_BACKLOG = 6;

/**
 * Computes chunk jobs and sends their results back through the results queue. Never touches SQLite,
 * so the same processor runs inside the api (embedded mode) or in any number of worker processes.
 */
@Processor(CHUNK_QUEUE, { ...QUEUE_LOCK_TIMING })
export class ChunkProcessor extends WorkerHost implements OnApplicationBootstrap, OnModuleDestroy {
  private readonly logger = new Logger('ChunkProcessor');
  private readonly pool: ChunkThreadPool;
  private readonly transport: ResultTransport;

  constructor(
    @Inject(CHUNK_RUNTIME_OPTIONS) private readonly options: ChunkRuntimeOptions,
    @InjectQueue(RESULT_QUEUE) private readonly results: Queue,
  ) {
    super();
    this.pool = new ChunkThreadPool(options.threads);
    this.transport = options.transport ?? new InlineResultTransport();
  }

  onApplicationBootstrap(): void {
    this.worker.concurrency = this.options.concurrency;
  }

  async onModuleDestroy(): Promise<void> {
    await this.pool.close();
  }

  async process(job: Job<ChunkJobData>): Promise<{ n: number; computeMs: number; workerId: string }> {
    const d = job.data;
    let r;
    try {
      r = await this.pool.run(d);
    } catch (e) {
      // A definition the domain rejects fails the same way on every attempt: do not retry it.
      // (On a thread it arrives as a ChunkComputeError; computed inline it is the domain error itself.)
      if ((e instanceof ChunkComputeError || e instanceof DomainError) && e.details)
        throw new UnrecoverableError(e.message);
      throw e;
    }
    const binary = this.transport.binary;
    const columns: Record<string, string | Float64Array> = {};
    for (const [k, v] of Object.entries(r.columns)) columns[k] = binary ? v : encodeFloat64(v);
    const payload: ChunkResultPayload = {
      sweepId: d.sweepId,
      chunkIndex: d.chunkIndex,
      i0: d.i0,
      n: r.n,
      columns,
      flags: binary ? r.flags : encodeUint32(r.flags),
      workerId: this.options.workerId,
      computeMs: r.computeMs,
      attempt: job.attemptsMade + 1,
    };
    while ((await this.results.getWaitingCount()) >= MAX_RESULT_BACKLOG) await new Promise((r) => setTimeout(r, 25));
    // One result job per attempt; the api persists idempotently, so a duplicate is harmless.
    await this.results.add('chunk-result', this.transport.send(payload), {
      jobId: `${chunkJobId(d.sweepId, d.chunkIndex)}-a${job.attemptsMade + 1}`,
      attempts: 10,
      backoff: { type: 'exponential', delay: 500 },
      removeOnComplete: true,
      removeOnFail: 1000,
    });
    return { n: r.n, computeMs: r.computeMs, workerId: this.options.workerId };
  }

  /** After the last attempt the failure travels to the api like a result, so it can fail the sweep. */
  @OnWorkerEvent('failed')
  async onFailed(job: Job<ChunkJobData> | undefined, error: Error): Promise<void> {
    if (!job) return;
    const final =
      error instanceof UnrecoverableError ||
      error.name === 'UnrecoverableError' ||
      job.attemptsMade >= (job.opts.attempts ?? 1);
    if (!final) return;
    const d = job.data;
    this.logger.warn(`chunk ${d.chunkIndex} of sweep ${d.sweepId} failed for good: ${error.message}`);
    await this.results
      .add(
        'chunk-failed',
        { sweepId: d.sweepId, chunkIndex: d.chunkIndex, reason: error.message, workerId: this.options.workerId },
        {
          jobId: `${chunkJobId(d.sweepId, d.chunkIndex)}-failed`,
          attempts: 10,
          backoff: { type: 'exponential', delay: 500 },
          removeOnComplete: true,
        },
      )
      .catch((e: Error) => this.logger.error(`could not report chunk failure: ${e.message}`));
  }
}
