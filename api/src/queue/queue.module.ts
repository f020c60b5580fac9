import { BullModule, InjectQueue } from '@nestjs/bullmq';
import { Global, Inject, Injectable, Module, type DynamicModule, type OnApplicationShutdown } from '@nestjs/common';
import type { Queue } from 'bullmq';
import os from 'node:os';
import {
  CHUNK_QUEUE,
  ChunkProcessingModule,
  InlineResultTransport,
  InProcessResultTransport,
  RESULT_QUEUE,
  ResultTransport,
} from '@driftgrid/worker';
import type { AppConfig } from '../config/app-config.js';
import { QueueProbe } from '../health/health.controller.js';
import { createQueueConnection, type QueueConnection } from './queue-connection.js';

export const QUEUE_CONNECTION = Symbol('QUEUE_CONNECTION');

@Injectable()
export class BullQueueProbe extends QueueProbe {
  constructor(
    @Inject(QUEUE_CONNECTION) private readonly conn: QueueConnection,
    @InjectQueue(CHUNK_QUEUE) private readonly chunks: Queue,
  ) {
    super();
  }

  async probe() {
    await this.chunks.getJobCounts('waiting');
    return { status: 'ok' as const, mode: this.conn.mode };
  }
}

class ConnectionCloser implements OnApplicationShutdown {
  constructor(@Inject(QUEUE_CONNECTION) private readonly conn: QueueConnection) {}
  async onApplicationShutdown(): Promise<void> {
    await this.conn.connection.quit().catch(() => undefined);
  }
}

/** BullMQ wiring for the api: the connection, both queues and (embedded mode) the chunk processor. */
@Global()
@Module({})
export class QueueModule {
  static forRoot(config: AppConfig): DynamicModule {
    const conn = createQueueConnection(config);
    const embeddedWorkers = config.embeddedWorkers ?? (conn.mode === 'embedded' ? 1 : 0);
    // In-memory queue: processor and api share the process, so results move by reference.
    const transport = conn.mode === 'embedded' ? new InProcessResultTransport() : new InlineResultTransport();
    const imports: DynamicModule[] = [
      BullModule.forRoot({ connection: conn.connection, prefix: config.queuePrefix }),
      BullModule.registerQueue({ name: CHUNK_QUEUE }, { name: RESULT_QUEUE }),
    ];
    if (embeddedWorkers > 0) {
      imports.push(
        ChunkProcessingModule.forRoot({
          concurrency: embeddedWorkers + 1,
          threads: embeddedWorkers,
          workerId: `${os.hostname()}:${process.pid}`,
          transport,
        }),
      );
    }
    return {
      module: QueueModule,
      imports,
      providers: [
        { provide: QUEUE_CONNECTION, useValue: conn },
        { provide: ResultTransport, useValue: transport },
        BullQueueProbe,
        { provide: QueueProbe, useExisting: BullQueueProbe },
        ConnectionCloser,
      ],
      exports: [QUEUE_CONNECTION, QueueProbe, BullModule, ResultTransport],
    };
  }
}
