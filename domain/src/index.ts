// Public surface of the domain package. Each area owns its own index file.
export * from './errors.js';
export * from './expression-constants.js';
export * from './models/types.js';
export * from './models/index.js';
export * from './units/index.js';
export * from './derived/index.js';
export * from './sweep/index.js';
export * from './fit/index.js';
export * from './sensitivity/index.js';
export * from './contracts/index.js';
export * from './plot/index.js';
