import { saltelliGroupSize } from '../sweep/sampling/saltelli.js';

/**
 * One output of a Saltelli design, regrouped for the estimators: per complete sample group j,
 * f(A)_j, f(B)_j and f(A_B^(i))_j (group-major: fAB[j·d + i]).
 */
export interface SaltelliOutputs {
  dims: number;
  /** Complete groups kept. */
  n: number;
  /** Groups left out: a point not computed yet, or a value that is not finite (NaN, ±∞). */
  dropped: number;
  fA: Float64Array;
  fB: Float64Array;
  fAB: Float64Array;
}

/**
 * Regroup an output given by point index (`values[p]`, p = j·(d + 2) + r, NaN where missing) into
 * complete sample groups. A group with any missing or non-finite value is dropped whole: the
 * estimators pair A, B and A_B^(i) of the same group, so a partial group carries no usable term.
 */
export function saltelliOutputs(values: ArrayLike<number>, dims: number, samples: number): SaltelliOutputs {
  const size = saltelliGroupSize(dims);
  const fA = new Float64Array(samples);
  const fB = new Float64Array(samples);
  const fAB = new Float64Array(samples * dims);
  let n = 0;
  for (let j = 0; j < samples; j++) {
    const p = j * size;
    if (p + size > values.length) break;
    let ok = true;
    for (let r = 0; r < size && ok; r++) ok = Number.isFinite(values[p + r]);
    if (!ok) continue;
    fA[n] = values[p]!;
    fB[n] = values[p + size - 1]!;
    for (let i = 0; i < dims; i++) fAB[n * dims + i] = values[p + 1 + i]!;
    n++;
  }
  return {
    dims,
    n,
    dropped: samples - n,
    fA: fA.subarray(0, n),
    fB: fB.subarray(0, n),
    fAB: fAB.subarray(0, n * dims),
  };
}
