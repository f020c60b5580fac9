import { JOE_KUO_ROWS } from './sobol-directions.js';

/** Dimensions the embedded direction numbers cover (dimension 1 plus one per table row). */
export const MAX_SOBOL_DIMENSIONS = JOE_KUO_ROWS.length + 1;
/** Indices are 32-bit: point i needs i < 2^32. */
export const MAX_SOBOL_INDEX = 2 ** 32 - 1;

const BITS = 32;
const SCALE = 2 ** -32;

/**
 * Direction integers V_k (k = 1..32, stored at k-1) scaled by 2^32, by the Bratley–Fox recurrence
 * V_k = V_{k-s} ⊕ (V_{k-s} >> s) ⊕ ⊕_{j=1}^{s-1} a_j V_{k-j} as in Joe & Kuo's reference program.
 */
function directionIntegers(dim: number): Uint32Array {
  const v = new Uint32Array(BITS);
  if (dim === 0) {
    for (let k = 0; k < BITS; k++) v[k] = 2 ** (BITS - 1 - k);
    return v;
  }
  const row = JOE_KUO_ROWS[dim - 1]!;
  const s = row[0]!;
  const a = row[1]!;
  for (let k = 0; k < Math.min(s, BITS); k++) v[k] = (row[2 + k]! * 2 ** (BITS - 1 - k)) >>> 0;
  for (let k = s; k < BITS; k++) {
    let x = (v[k - s]! ^ (v[k - s]! >>> s)) >>> 0;
    for (let j = 1; j < s; j++) {
      if ((a >>> (s - 1 - j)) & 1) x = (x ^ v[k - j]!) >>> 0;
    }
    v[k] = x;
  }
  return v;
}

const TABLE: Uint32Array[] = Array.from({ length: MAX_SOBOL_DIMENSIONS }, (_, d) => directionIntegers(d));

/**
 * Coordinate `dim` (0-based) of Sobol point `index` (0 = the origin), unscrambled, in Gray-code
 * order (the order of Joe & Kuo's program): x = ⊕ over the set bits k of gray(i) = i ⊕ (i >> 1) of V_k.
 * O(32) per coordinate from the index alone, so any chunk starts anywhere.
 */
export function sobolCoordinate(index: number, dim: number): number {
  const v = TABLE[dim];
  if (!v) throw new RangeError(`Sobol dimension ${dim + 1} exceeds the ${MAX_SOBOL_DIMENSIONS} embedded`);
  if (!Number.isInteger(index) || index < 0 || index > MAX_SOBOL_INDEX) {
    throw new RangeError(`Sobol index ${index} outside 0..${MAX_SOBOL_INDEX}`);
  }
  let g = (index ^ (index >>> 1)) >>> 0;
  let x = 0;
  for (let k = 0; g !== 0; k++, g >>>= 1) {
    if (g & 1) x = (x ^ v[k]!) >>> 0;
  }
  return x * SCALE;
}

/** All `dims` coordinates of point `index`, written into `out` (allocated when omitted). */
export function sobolPoint(index: number, dims: number, out: Float64Array = new Float64Array(dims)): Float64Array {
  for (let d = 0; d < dims; d++) out[d] = sobolCoordinate(index, d);
  return out;
}

/** The raw direction integers of one dimension (for tests). */
export function sobolDirections(dim: number): Uint32Array {
  const v = TABLE[dim];
  if (!v) throw new RangeError(`Sobol dimension ${dim + 1} exceeds the ${MAX_SOBOL_DIMENSIONS} embedded`);
  return v.slice();
}
