// Variance-based sensitivity: Sobol indices from a Saltelli design (sweep sampling kind "saltelli").
export { saltelliOutputs, type SaltelliOutputs } from './saltelli-outputs.js';
export {
  estimateSobolIndices,
  DEFAULT_LEVEL,
  DEFAULT_RESAMPLES,
  DEFAULT_SEED,
  type SobolEstimate,
  type SobolIndex,
  type SobolOptions,
  type BootstrapSettings,
} from './sobol-indices.js';
export { quantileSorted } from './percentile.js';
