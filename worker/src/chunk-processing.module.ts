import { BullModule } from '@nestjs/bullmq';
import { Module, type DynamicModule } from '@nestjs/common';
import { CHUNK_RUNTIME_OPTIONS, ChunkProcessor, type ChunkRuntimeOptions } from './chunk.processor.js';
import { CHUNK_QUEUE, RESULT_QUEUE } from './queue-names.js';

/** Registers the chunk processor; the host (api or standalone worker) provides BullModule.forRoot. */
@Module({})
export class ChunkProcessingModule {
  static forRoot(options: ChunkRuntimeOptions): DynamicModule {
    return {
      module: ChunkProcessingModule,
      imports: [BullModule.registerQueue({ name: CHUNK_QUEUE }, { name: RESULT_QUEUE })],
      providers: [{ provide: CHUNK_RUNTIME_OPTIONS, useValue: options }, ChunkProcessor],
    };
  }
}
