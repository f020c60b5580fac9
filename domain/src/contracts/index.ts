export * from './auth.js';
export * from './text-safety.js';
export * from './accounts.js';
export * from './catalogue.js';
export * from './datasets.js';
export * from './fits.js';
export * from './sensitivity.js';
export * from './queue.js';
