import { describe, expect, it } from 'vitest';
import { LatinHypercube } from './latin-hypercube.js';
import { IndexPermutation } from './permutation.js';

describe('keyed index permutation', () => {
  it('is a bijection of [0, n) for awkward sizes', () => {
    for (const n of [1, 2, 3, 7, 100, 1023, 1024, 1025, 65537]) {
      const p = new IndexPermutation(n, 12345);
      const hit = new Uint8Array(n);
      for (let i = 0; i < n; i++) {
        const j = p.at(i);
        if (j >= 0 && j < n) hit[j]! += 1;
      }
      expect(hit.every((h) => h === 1)).toBe(true);
    }
  });
});

describe('latin hypercube', () => {
  // Defining property of an LHS (McKay, Beckman & Conover 1979): projected on any axis, each of the
  // n equal strata holds exactly one of the n points.
  it('puts exactly one sample in each stratum of each axis', () => {
    for (const [n, dims] of [
      [1, 1],
      [10, 3],
      [997, 4],
      [4096, 2],
    ] as const) {
      const lhs = new LatinHypercube(n, dims, 42);
      for (let d = 0; d < dims; d++) {
        const counts = new Uint32Array(n);
        for (let i = 0; i < n; i++) {
          const u = lhs.coordinate(i, d);
          expect(u).toBeGreaterThanOrEqual(0);
          expect(u).toBeLessThan(1);
          counts[Math.floor(u * n)]! += 1;
        }
        expect(counts.every((c) => c === 1)).toBe(true);
      }
    }
  });

  it('is reproducible from the seed and changes with it', () => {
    const a = new LatinHypercube(500, 3, 7);
    const b = new LatinHypercube(500, 3, 7);
    const c = new LatinHypercube(500, 3, 8);
    let differ = 0;
    for (let i = 0; i < 500; i++) {
      for (let d = 0; d < 3; d++) {
        expect(a.coordinate(i, d)).toBe(b.coordinate(i, d));
        if (a.coordinate(i, d) !== c.coordinate(i, d)) differ++;
      }
    }
    expect(differ).toBeGreaterThan(1400);
  });

  it('gives different axes different permutations', () => {
    const lhs = new LatinHypercube(1000, 2, 1);
    let same = 0;
    for (let i = 0; i < 1000; i++) if (lhs.stratum(i, 0) === lhs.stratum(i, 1)) same++;
    // Two independent random permutations agree in about one place on average.
    expect(same).toBeLessThan(20);
  });

  it('looks uniform: axis-pair correlation near zero (common practice sanity check)', () => {
    const n = 20000;
    const lhs = new LatinHypercube(n, 2, 2024);
    let sxy = 0;
    for (let i = 0; i < n; i++) sxy += (lhs.coordinate(i, 0) - 0.5) * (lhs.coordinate(i, 1) - 0.5);
    const corr = sxy / n / (1 / 12);
    // Standard error of a correlation estimate ≈ 1/sqrt(n) ≈ 0.007.
    expect(Math.abs(corr)).toBeLessThan(0.04);
  });

  it('rejects bad sizes and seeds', () => {
    expect(() => new LatinHypercube(0, 1, 1)).toThrow(RangeError);
    expect(() => new LatinHypercube(10, 1, -1)).toThrow(RangeError);
  });
});
