import { MAX_SOBOL_DIMENSIONS, MAX_SOBOL_INDEX, sobolCoordinate } from './sobol.js';

/**
 * The Saltelli design for first-order and total Sobol indices (A. Saltelli et al., "Variance based
 * sensitivity analysis of model output. Design and estimator for the total sensitivity index",
 * Comput. Phys. Commun. 181 (2010) 259–270, §3): two N×d matrices A and B and, for each input i, the
 * matrix A_B^(i) — A with its column i taken from B. The model runs on N·(d + 2) rows.
 *
 * Rows of sample group j come together, so point index p = j·(d + 2) + r with
 *   r = 0      → row j of A,
 *   r = 1..d   → row j of A_B^(r−1) (input r−1 from B, every other input from A),
 *   r = d + 1  → row j of B.
 * A complete group needs only contiguous indices, so every chunk of a partly computed sweep adds whole
 * groups, and a point is a pure function of its index (no state, any chunk on any worker).
 *
 * Row j of [A | B] is point j of the 2d-dimensional Sobol sequence (Joe–Kuo directions, unscrambled,
 * origin first): A uses dimensions 0..d−1 and B dimensions d..2d−1 (the construction of §3 of the paper).
 */

/** Inputs a Saltelli design can cover: 2d Sobol dimensions are needed. */
export const MAX_SALTELLI_DIMENSIONS = Math.floor(MAX_SOBOL_DIMENSIONS / 2);

/** Model runs per sample group: A, the d matrices A_B^(i), B. */
export function saltelliGroupSize(dims: number): number {
  return dims + 2;
}

/** Total points of a design with `samples` groups over `dims` inputs: N·(d + 2). */
export function saltelliPointCount(samples: number, dims: number): number {
  return samples * saltelliGroupSize(dims);
}

/** Where point `index` sits in the design: its sample group and its row kind. */
export interface SaltelliRole {
  group: number;
  /** 'A', 'B', or 'AB' with `input` the column taken from B. */
  matrix: 'A' | 'AB' | 'B';
  input: number;
}

export function saltelliRole(index: number, dims: number): SaltelliRole {
  const size = saltelliGroupSize(dims);
  const group = Math.floor(index / size);
  const r = index - group * size;
  if (r === 0) return { group, matrix: 'A', input: -1 };
  if (r === size - 1) return { group, matrix: 'B', input: -1 };
  return { group, matrix: 'AB', input: r - 1 };
}

/**
 * Unit-cube coordinate `dim` (0-based, < dims) of design point `index` of a `dims`-input design.
 * O(32) from the index alone.
 */
export function saltelliCoordinate(index: number, dim: number, dims: number): number {
  if (!Number.isInteger(dims) || dims < 1 || dims > MAX_SALTELLI_DIMENSIONS)
    throw new RangeError(`a Saltelli design covers 1..${MAX_SALTELLI_DIMENSIONS} inputs, not ${dims}`);
  if (!Number.isInteger(dim) || dim < 0 || dim >= dims) throw new RangeError(`input ${dim} outside 0..${dims - 1}`);
  const size = dims + 2;
  const group = Math.floor(index / size);
  if (!Number.isSafeInteger(index) || index < 0 || group > MAX_SOBOL_INDEX)
    throw new RangeError(`Saltelli point ${index} outside the design`);
  const r = index - group * size;
  // From B on the B row, and on the A_B^(dim) row for this one input.
  const fromB = r === size - 1 || r === dim + 1;
  return sobolCoordinate(group, fromB ? dims + dim : dim);
}
