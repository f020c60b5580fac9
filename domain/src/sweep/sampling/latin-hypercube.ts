import { hashUnit, mixKey } from './hash.js';
import { IndexPermutation } from './permutation.js';

/** Largest design the index permutation supports. */
export const MAX_LHS_SAMPLES = 2 ** 30;

/**
 * Latin-hypercube design of `samples` points in [0,1)^dims, reproducible from `seed`.
 * Axis a of point i falls in stratum π_a(i) of the `samples` equal strata, where π_a is a seeded
 * pseudo-random permutation, and sits at a seeded uniform offset inside it:
 *   u_a(i) = (π_a(i) + r_a(i)) / samples.
 * So each stratum of each axis holds exactly one point (McKay, Beckman & Conover, Technometrics 21
 * (1979) 239–245). Memory: O(dims) — the permutation is a keyed Feistel bijection evaluated per
 * index (see permutation.ts), not a stored shuffle, so 10^7 samples × 16 axes need no 640 MB of
 * Int32Arrays and every chunk starts at any index without replaying a generator.
 */
export class LatinHypercube {
  private readonly perms: IndexPermutation[];
  private readonly jitterKeys: number[];

  constructor(
    readonly samples: number,
    readonly dims: number,
    readonly seed: number,
  ) {
    if (!Number.isInteger(samples) || samples < 1 || samples > MAX_LHS_SAMPLES) {
      throw new RangeError(`latin-hypercube samples ${samples} outside 1..${MAX_LHS_SAMPLES}`);
    }
    if (!Number.isSafeInteger(seed) || seed < 0)
      throw new RangeError(`latin-hypercube seed ${seed} must be a non-negative integer`);
    this.perms = [];
    this.jitterKeys = [];
    for (let a = 0; a < dims; a++) {
      this.perms.push(new IndexPermutation(samples, mixKey(seed, a, 0)));
      this.jitterKeys.push(mixKey(seed, a, 1));
    }
  }

  /** The stratum (0..samples-1) that axis `dim` of point `index` falls in. */
  stratum(index: number, dim: number): number {
    return this.perms[dim]!.at(index);
  }

  /** Coordinate `dim` of point `index`, in [0, 1). */
  coordinate(index: number, dim: number): number {
    const u = (this.perms[dim]!.at(index) + hashUnit(this.jitterKeys[dim]!, index)) / this.samples;
    // Guard the top stratum against rounding up to exactly 1.
    return u < 1 ? u : 1 - Number.EPSILON / 2;
  }
}
