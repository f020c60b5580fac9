export * from './worker-config.js';
export * from './worker.module.js';
