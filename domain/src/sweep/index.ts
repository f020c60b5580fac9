// Sweeps: definition schema, compilation against a model, sampling designs and the chunk evaluator.
export {
  sweepDefinitionSchema,
  axisSchema,
  linearAxisSchema,
  logAxisSchema,
  listAxisSchema,
  samplingSchema,
  derivedSchema,
  quantitySchema,
  type SweepDefinition,
  type SweepDefinitionInput,
  type SweepAxis,
  type SweepSampling,
  type SweepDerived,
} from './schema.js';
export {
  parseSweepDefinition,
  safeParseSweepDefinition,
  issuesToDetails,
  summarise as summariseSweepErrors,
} from './parse.js';
export { sweepFieldLabel, labelSweepErrors, inputSymbol } from './labels.js';
export {
  compileSweep,
  checkSweep,
  type CompiledSweep,
  type SweepColumn,
  type ChunkResult,
  type PointEvaluation,
} from './compile.js';
export { type ResolvedAxis, axisValueAt, gridValues } from './axes.js';
export { type InputSource } from './fixed.js';
export { planChunks, chunkCount, type ChunkPlan } from './chunks.js';
export { estimateSweep, type SweepEstimate } from './estimate.js';
export {
  MAX_POINTS_HARD,
  DEFAULT_CHUNK_SIZE,
  MAX_AXIS_COUNT,
  MAX_AXES,
  MAX_RANDOM_SAMPLES,
  MAX_DERIVED,
  MAX_TAGS,
} from './limits.js';
export { gridDigits, gridIndex, gridIncrement, gridSize } from './sampling/grid.js';
export { LatinHypercube, MAX_LHS_SAMPLES } from './sampling/latin-hypercube.js';
export { sobolCoordinate, sobolPoint, MAX_SOBOL_DIMENSIONS, MAX_SOBOL_INDEX } from './sampling/sobol.js';
export {
  saltelliCoordinate,
  saltelliGroupSize,
  saltelliPointCount,
  saltelliRole,
  MAX_SALTELLI_DIMENSIONS,
  type SaltelliRole,
} from './sampling/saltelli.js';
