/** The model registry: every model Driftgrid can evaluate, looked up by id. */
import { NotFoundError } from '../errors.js';
import { allocateOutputs } from './common.js';
import { columnProfile } from './column-profile.js';
import { crossField } from './cross-field.js';
import { parallelBalance } from './parallel-balance.js';
import type {
  ChunkOutput,
  FlagSpec,
  InputSpec,
  ModelDefinition,
  OrderingSpec,
  OutputSpec,
  ThresholdSpec,
} from './types.js';

export const models: readonly ModelDefinition[] = Object.freeze([crossField, parallelBalance, columnProfile]);

export function getModel(id: string): ModelDefinition {
  const m = models.find((x) => x.id === id);
  if (!m) {
    const known = models.map((x) => x.id).join(', ');
    throw new NotFoundError(`Unknown model "${id}"; known models: ${known}`, [
      { path: 'model', message: `unknown model "${id}"; known models: ${known}` },
    ]);
  }
  return m;
}

/** Preallocated output columns (one Float64Array per output, booleans as 0/1) and a flag mask array. */
export function allocateChunk(model: ModelDefinition, n: number): ChunkOutput {
  return allocateOutputs(model.outputs, n);
}

/** JSON-safe registry entry (no functions) for GET /api/models and GET /api/models/:id. */
export interface ModelSummary {
  id: string;
  version: string;
  title: string;
  summary: string;
  inputs: InputSpec[];
  outputs: OutputSpec[];
  flags: FlagSpec[];
  thresholds: ThresholdSpec[];
  orderings: OrderingSpec[];
  /** True when the model returns radial profiles for plotting (`profile`). */
  hasProfile: boolean;
}

export function modelSummary(model: ModelDefinition): ModelSummary {
  return {
    id: model.id,
    version: model.version,
    title: model.title,
    summary: model.summary,
    inputs: model.inputs.map((i) => ({ ...i })),
    outputs: model.outputs.map((o) => ({ ...o })),
    flags: model.flags.map((f) => ({ ...f })),
    thresholds: model.thresholds.map((t) => ({ ...t })),
    orderings: model.orderings.map((o) => ({ ...o })),
    hasProfile: typeof model.profile === 'function',
  };
}

export function listModelSummaries(): ModelSummary[] {
  return models.map(modelSummary);
}
