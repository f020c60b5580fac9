export { models, getModel, allocateChunk, listModelSummaries, modelSummary, type ModelSummary } from './registry.js';
export { resolveInputs, resolveThresholds, checkInputValue, describeRange } from './validate.js';
export { crossField } from './cross-field.js';
export { parallelBalance } from './parallel-balance.js';
export { columnProfile } from './column-profile.js';
