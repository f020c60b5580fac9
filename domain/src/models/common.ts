/**
 * Helpers shared by the model files: one-point evaluation through the chunk kernel (so a single
 * point and a chunk can never disagree), flag-mask decoding and threshold merging.
 */
import type {
  ChunkOutput,
  FlagSpec,
  ModelDefinition,
  OutputSpec,
  PointResult,
  ThresholdSpec,
  Thresholds,
} from './types.js';

/** Allocate the output columns of a model for n points (booleans stored as 0/1). */
export function allocateOutputs(outputs: readonly OutputSpec[], n: number): ChunkOutput {
  const columns: Record<string, Float64Array> = {};
  for (const o of outputs) columns[o.name] = new Float64Array(n);
  return { columns, flags: new Uint32Array(n) };
}

/** Thresholds with defaults filled in; unknown names are ignored here (validate.ts rejects them). */
export function thresholdValue(specs: readonly ThresholdSpec[], given: Thresholds | undefined, name: string): number {
  const v = given?.[name];
  if (typeof v === 'number' && !Number.isNaN(v)) return v;
  const spec = specs.find((t) => t.name === name);
  if (!spec) throw new Error(`unknown threshold ${name}`);
  return spec.default;
}

/** Flag codes set in a mask, in the order the model lists its flags. */
export function flagCodes(flags: readonly FlagSpec[], mask: number): string[] {
  const codes: string[] = [];
  for (const f of flags) if (mask & (1 << f.bit)) codes.push(f.code);
  return codes;
}

/** Mask of the flags that mark a point invalid. */
export function invalidatingMask(flags: readonly FlagSpec[]): number {
  let m = 0;
  for (const f of flags) if (f.invalidates) m |= 1 << f.bit;
  return m;
}

/** The input columns a chunk kernel reads; a missing one is a programming error, so it throws. */
export function inputColumns(
  names: readonly string[],
  inputs: Record<string, Float64Array>,
  n: number,
): Float64Array[] {
  return names.map((name) => {
    const col = inputs[name];
    if (!col) throw new Error(`evaluateChunk: input column ${name} is missing`);
    if (col.length < n) throw new Error(`evaluateChunk: input column ${name} has ${col.length} < ${n} values`);
    return col;
  });
}

/** The output columns a kernel writes, in the model's output order. */
export function outputColumns(outputs: readonly OutputSpec[], out: ChunkOutput, n: number): Float64Array[] {
  if (out.flags.length < n) throw new Error(`evaluateChunk: flags array shorter than ${n}`);
  return outputs.map((o) => {
    const col = out.columns[o.name];
    if (!col || col.length < n) throw new Error(`evaluateChunk: output column ${o.name} missing or shorter than ${n}`);
    return col;
  });
}

/** Evaluate one point by running the chunk kernel on columns of length 1. */
export function evaluateViaChunk(
  model: Pick<ModelDefinition, 'inputs' | 'outputs' | 'flags' | 'evaluateChunk'>,
  inputs: Record<string, number>,
  thresholds?: Thresholds,
): PointResult {
  const cols: Record<string, Float64Array> = {};
  for (const spec of model.inputs) {
    const v = inputs[spec.name];
    cols[spec.name] = Float64Array.of(typeof v === 'number' ? v : spec.default);
  }
  const out = allocateOutputs(model.outputs, 1);
  model.evaluateChunk(cols, 1, out, thresholds);
  const outputs: Record<string, number | boolean> = {};
  for (const o of model.outputs) {
    const v = out.columns[o.name]![0]!;
    outputs[o.name] = o.kind === 'boolean' ? v !== 0 : v;
  }
  return { outputs, flags: flagCodes(model.flags, out.flags[0]!) };
}
