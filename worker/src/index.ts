export * from './worker-config.js';
export * from './worker.module.js';
export * from './queue-names.js';
export * from './chunk-job.js';
export * from './chunk-codec.js';
export * from './chunk.processor.js';
export * from './chunk-processing.module.js';
export * from './thread-pool.js';
