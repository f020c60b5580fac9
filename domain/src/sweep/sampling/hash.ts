/**
 * Stateless 32-bit mixing used by the random designs. Every draw is a pure function of
 * (seed, axis, index), so point i of a design is computable from its index in any chunk, on any
 * worker, without replaying a generator stream.
 * The finaliser is MurmurHash3's fmix32 (public domain; common practice for integer hashing).
 */
export function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/** Fold a non-negative safe-integer seed and small stream ids into one 32-bit key. */
export function mixKey(seed: number, a: number, b: number): number {
  const lo = seed >>> 0;
  const hi = Math.floor(seed / 2 ** 32) >>> 0;
  let h = fmix32(lo ^ 0x9e3779b9);
  h = fmix32((h ^ hi) + 0x7f4a7c15);
  h = fmix32((h ^ Math.imul(a + 1, 0x632be5ab)) >>> 0);
  h = fmix32((h ^ Math.imul(b + 1, 0x2545f491)) >>> 0);
  return h;
}

/** A uniform draw in [0, 1) from a key and an index (53-bit resolution from two hashes). */
export function hashUnit(key: number, index: number): number {
  const lo = index >>> 0;
  const hi = Math.floor(index / 2 ** 32) >>> 0;
  const h1 = fmix32((key ^ fmix32(lo + 0x68e31da4)) >>> 0);
  const h2 = fmix32((h1 ^ hi ^ 0x1b873593) >>> 0);
  return ((h1 >>> 5) * 67108864 + (h2 >>> 6)) / 9007199254740992;
}
