import { BullModule, InjectQueue } from '@nestjs/bullmq';
import { Inject, Injectable, Module, type DynamicModule, type OnApplicationShutdown } from '@nestjs/common';
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
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { QueueProbe } from '../health/queue-probe.js';
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

/**
 * The queue connection, both queues, the result transport and the health probe. A static module, so
 * every importer (sweeps, health, the root wiring below) shares one connection and one transport.
 */
@Module({
  imports: [BullModule.registerQueue({ name: CHUNK_QUEUE }, { name: RESULT_QUEUE })],
  providers: [
    { provide: QUEUE_CONNECTION, inject: [APP_CONFIG], useFactory: (c: AppConfig) => createQueueConnection(c) },
    {
      provide: ResultTransport,
      inject: [QUEUE_CONNECTION],
      // In-memory queue: processor and api share the process, so results move by reference.
      useFactory: (conn: QueueConnection): ResultTransport =>
        conn.mode === 'embedded' ? new InProcessResultTransport() : new InlineResultTransport(),
    },
    BullQueueProbe,
    { provide: QueueProbe, useExisting: BullQueueProbe },
    ConnectionCloser,
  ],
  exports: [QUEUE_CONNECTION, QueueProbe, BullModule, ResultTransport],
})
export class QueueModule {}

/**
 * Imported once, by the app module: BullMQ's root configuration on QueueModule's connection and, when
 * this process computes chunks itself (embedded mode or EMBEDDED_WORKERS), the chunk processor.
 */
@Module({})
export class QueueRootModule {
  static forRoot(config: AppConfig): DynamicModule {
    // createQueueConnection picks the embedded queue exactly when no Redis URL is configured.
    const embeddedWorkers = config.embeddedWorkers ?? (config.redisUrl ? 0 : 1);
    const imports: DynamicModule[] = [
      BullModule.forRootAsync({
        imports: [QueueModule],
        inject: [QUEUE_CONNECTION],
        useFactory: (conn: QueueConnection) => ({ connection: conn.connection, prefix: config.queuePrefix }),
      }),
    ];
    if (embeddedWorkers > 0) {
      imports.push(
        ChunkProcessingModule.forRootAsync({
          imports: [QueueModule],
          inject: [ResultTransport],
          useFactory: (transport: ResultTransport) => ({
            concurrency: embeddedWorkers + 1,
            threads: embeddedWorkers,
            workerId: `${os.hostname()}:${process.pid}`,
            transport,
          }),
        }),
      );
    }
    return { module: QueueRootModule, imports: [QueueModule, ...imports], exports: [QueueModule] };
  }
}
