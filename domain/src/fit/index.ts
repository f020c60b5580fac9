// Fit engine: reduced models fitted by Levenberg–Marquardt with standard errors (SPEC §8).
export { fitModel } from './fit-model.js';
export { DEFAULT_SIGMA_MODE, FIT_MODEL_KINDS } from './types.js';
export type {
  FitAdvice,
  FitInput,
  FitResult,
  FitModelKind,
  FitParameter,
  ParameterBound,
  SigmaMode,
  Column as FitColumn,
} from './types.js';
export { regularizedBeta, tQuantile, tTwoSidedTail } from './stats/t-quantile.js';
export { chiSquareUpperTail } from './stats/chi-square.js';
export { retardationRegion, type ProbeRegion } from './probe/region.js';
export { probeDensity, DEFAULT_SHEATH_FACTOR, type ProbeGeometry, type DerivedQuantity } from './probe/density.js';
export { fitParameterUnit, exponentialScaleIsTe, type ParamUnitContext } from './param-unit.js';
