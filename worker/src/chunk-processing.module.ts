import { BullModule } from '@nestjs/bullmq';
import { Module, type DynamicModule, type InjectionToken, type ModuleMetadata } from '@nestjs/common';
import { CHUNK_RUNTIME_OPTIONS, ChunkProcessor, type ChunkRuntimeOptions } from './chunk.processor.js';
import { CHUNK_QUEUE, RESULT_QUEUE } from './queue-names.js';

/** Options built by the host's providers (the api passes its shared ResultTransport this way). */
export interface ChunkProcessingAsyncOptions {
  imports?: ModuleMetadata['imports'];
  inject?: InjectionToken[];
  useFactory: (...deps: never[]) => ChunkRuntimeOptions;
}

/** Registers the chunk processor; the host (api or standalone worker) provides BullModule.forRoot. */
@Module({})
export class ChunkProcessingModule {
  static forRoot(options: ChunkRuntimeOptions): DynamicModule {
    return ChunkProcessingModule.forRootAsync({ useFactory: () => options });
  }

  static forRootAsync(options: ChunkProcessingAsyncOptions): DynamicModule {
    return {
      module: ChunkProcessingModule,
      imports: [...(options.imports ?? []), BullModule.registerQueue({ name: CHUNK_QUEUE }, { name: RESULT_QUEUE })],
      providers: [
        { provide: CHUNK_RUNTIME_OPTIONS, inject: options.inject ?? [], useFactory: options.useFactory },
        ChunkProcessor,
      ],
    };
  }
}
