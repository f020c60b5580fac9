import { Module, type DynamicModule } from '@nestjs/common';
import type { WorkerConfig } from './worker-config.js';

export const WORKER_CONFIG = Symbol('WORKER_CONFIG');

/** The standalone worker's Nest application context; the chunk processor registers here. */
@Module({})
export class WorkerModule {
  static forRoot(config: WorkerConfig, imports: DynamicModule[] = []): DynamicModule {
    return {
      module: WorkerModule,
      imports,
      providers: [{ provide: WORKER_CONFIG, useValue: config }],
      exports: [WORKER_CONFIG],
    };
  }
}
