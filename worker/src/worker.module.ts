import { BullModule } from '@nestjs/bullmq';
import { Module, type DynamicModule } from '@nestjs/common';
import { Redis } from 'ioredis';
import { ChunkProcessingModule } from './chunk-processing.module.js';
import type { WorkerConfig } from './worker-config.js';

export const WORKER_CONFIG = Symbol('WORKER_CONFIG');

/** The standalone worker: BullMQ on the shared Redis plus the chunk processor. No database. */
@Module({})
export class WorkerModule {
  static forRoot(config: WorkerConfig): DynamicModule {
    return {
      module: WorkerModule,
      imports: [
        BullModule.forRoot({
          connection: new Redis(config.redisUrl, { maxRetriesPerRequest: null }),
          prefix: config.queuePrefix,
        }),
        ChunkProcessingModule.forRoot({
          concurrency: config.concurrency,
          threads: config.threads,
          workerId: config.workerId,
        }),
      ],
      providers: [{ provide: WORKER_CONFIG, useValue: config }],
      exports: [WORKER_CONFIG],
    };
  }
}
