/**
 * Index arithmetic of a grid sweep (mixed radix, last axis fastest — as domain/src/sweep/sampling/grid.ts).
 * Plots pick their points by index, so a slice through a million-point grid reads only the rows it shows.
 */

/** Stride of each axis: index = Σ digit_k · stride_k. */
export function gridStrides(counts: readonly number[]): number[] {
  const strides = new Array<number>(counts.length);
  let s = 1;
  for (let k = counts.length - 1; k >= 0; k--) {
    strides[k] = s;
    s *= counts[k];
  }
  return strides;
}

/** Digits 0, step, 2·step, … of an axis with `count` values, always ending on the last value. */
export function strideDigits(count: number, maxValues: number): number[] {
  const limit = Math.max(1, Math.floor(maxValues));
  if (count <= limit) return Array.from({ length: count }, (_, i) => i);
  if (limit === 1) return [0];
  // Spread `limit` digits evenly over [0, count-1], endpoints included; rounding keeps them distinct.
  const out: number[] = [];
  for (let i = 0; i < limit; i++) out.push(Math.round((i * (count - 1)) / (limit - 1)));
  return [...new Set(out)];
}

/**
 * Indices of the grid points where the `free` axes take the listed digits and every other axis is
 * held at `fixed[k]`. Returned in the order of the nested loops (first free axis outermost).
 */
export function sliceIndices(
  strides: readonly number[],
  fixed: readonly number[],
  free: { axis: number; digits: readonly number[] }[],
): number[] {
  let base = 0;
  const freeAxes = new Set(free.map((f) => f.axis));
  for (let k = 0; k < strides.length; k++) if (!freeAxes.has(k)) base += fixed[k] * strides[k];
  let out = [base];
  for (const f of free) {
    const next: number[] = [];
    for (const b of out) for (const d of f.digits) next.push(b + d * strides[f.axis]);
    out = next;
  }
  return out;
}
