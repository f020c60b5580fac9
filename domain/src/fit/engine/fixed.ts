import type { CompiledModel } from '../types.js';

/**
 * The model over its free parameters only, the fixed ones held at their values: the optimisers, the
 * covariance and the degrees of freedom then see just the parameters the data determine.
 * `free[k]` is the index in the full model of reduced parameter k.
 */
export interface ReducedModel {
  model: CompiledModel;
  free: number[];
  /** The full parameter vector for a reduced one. */
  expand(reduced: ArrayLike<number>): Float64Array;
}

export function reduceModel(full: CompiledModel, fixed: ReadonlyMap<number, number>): ReducedModel {
  const p = full.paramNames.length;
  const free = Array.from({ length: p }, (_, j) => j).filter((j) => !fixed.has(j));
  const base = Float64Array.from(full.start);
  for (const [j, v] of fixed) base[j] = v;
  const expand = (reduced: ArrayLike<number>): Float64Array => {
    const out = Float64Array.from(base);
    free.forEach((j, k) => (out[j] = reduced[k]!));
    return out;
  };
  if (fixed.size === 0) return { model: full, free, expand };
  const { n } = full;
  const fullParams = Float64Array.from(base);
  const fill = (reduced: Float64Array): Float64Array => {
    for (let k = 0; k < free.length; k++) fullParams[free[k]!] = reduced[k]!;
    return fullParams;
  };
  const fullJac = full.jacobian ? new Float64Array(n * p) : undefined;
  const pick = (values: Float64Array): Float64Array => Float64Array.from(free, (j) => values[j]!);
  const model: CompiledModel = {
    paramNames: free.map((j) => full.paramNames[j]!),
    start: pick(full.start),
    min: pick(full.min),
    max: pick(full.max),
    n,
    evaluate: (reduced, out) => full.evaluate(fill(reduced), out),
    ...(full.jacobian && fullJac
      ? {
          jacobian: (reduced: Float64Array, jac: Float64Array) => {
            full.jacobian!(fill(reduced), fullJac);
            free.forEach((j, k) => jac.set(fullJac.subarray(j * n, (j + 1) * n), k * n));
          },
        }
      : {}),
  };
  return { model, free, expand };
}
