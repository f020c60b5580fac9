import { fmix32 } from './hash.js';

const ROUNDS = 6;

/**
 * A keyed pseudo-random bijection of [0, n) evaluated pointwise in O(1) memory: a balanced Feistel
 * network on the smallest even number of bits covering n, with cycle walking (re-apply until the
 * value falls below n). A Feistel network is a bijection for any round function, and cycle walking
 * keeps it one on [0, n) (Black & Rogaway, "Ciphers with arbitrary finite domains", 2002, common
 * practice in format-preserving encryption). The domain is < 4n, so on average fewer than 4 walks.
 */
export class IndexPermutation {
  private readonly half: number;
  private readonly mask: number;
  private readonly keys: Uint32Array;

  constructor(
    readonly n: number,
    key: number,
  ) {
    if (!Number.isInteger(n) || n < 1 || n > 2 ** 30) throw new RangeError(`permutation size ${n} outside 1..2^30`);
    let bits = 1;
    while (2 ** bits < n) bits++;
    this.half = Math.max(1, Math.ceil(bits / 2));
    this.mask = 2 ** this.half - 1;
    this.keys = new Uint32Array(ROUNDS);
    for (let r = 0; r < ROUNDS; r++) this.keys[r] = fmix32((key + Math.imul(r + 1, 0x9e3779b9)) >>> 0);
  }

  /** The image of i (0 ≤ i < n). */
  at(i: number): number {
    let x = i;
    do {
      x = this.encrypt(x);
    } while (x >= this.n);
    return x;
  }

  private encrypt(x: number): number {
    const { half, mask, keys } = this;
    let left = (x >>> half) & mask;
    let right = x & mask;
    for (let r = 0; r < ROUNDS; r++) {
      const f = fmix32((right ^ keys[r]!) >>> 0) & mask;
      const next = (left ^ f) & mask;
      left = right;
      right = next;
    }
    return left * 2 ** half + right;
  }
}
