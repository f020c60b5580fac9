import fc from 'fast-check';

// A fixed seed: the same cases on every run, so a failure can be replayed.
fc.configureGlobal({ seed: 20261201 });
import { describe, expect, it } from 'vitest';
import { gridDigits, gridIncrement, gridIndex, gridSize } from './grid.js';

describe('grid mixed-radix indexing', () => {
  const radices = [31, 50, 3, 3];

  it('counts the Cartesian product', () => {
    expect(gridSize(radices)).toBe(13950);
    expect(gridSize([])).toBe(1);
  });

  it('round-trips every index and steps like an odometer (last axis fastest)', () => {
    const digits = gridDigits(0, radices);
    const seen = new Set<string>();
    for (let i = 0; i < gridSize(radices); i++) {
      const decoded = gridDigits(i, radices);
      expect(Array.from(decoded)).toEqual(Array.from(digits));
      expect(gridIndex(decoded, radices)).toBe(i);
      seen.add(decoded.join(','));
      gridIncrement(digits, radices);
    }
    // Every combination appears exactly once.
    expect(seen.size).toBe(13950);
  });

  it('orders digits row-major', () => {
    expect(Array.from(gridDigits(1, radices))).toEqual([0, 0, 0, 1]);
    expect(Array.from(gridDigits(3, radices))).toEqual([0, 0, 1, 0]);
    expect(Array.from(gridDigits(9, radices))).toEqual([0, 1, 0, 0]);
    expect(Array.from(gridDigits(13949, radices))).toEqual([30, 49, 2, 2]);
  });

  it('rejects indices and digits out of range', () => {
    expect(() => gridDigits(13950, radices)).toThrow(RangeError);
    expect(() => gridDigits(-1, radices)).toThrow(RangeError);
    expect(() => gridIndex([0, 50, 0, 0], radices)).toThrow(RangeError);
  });

  it('handles indices beyond 2^32 exactly', () => {
    const big = [100000, 100000, 1000];
    const i = 9_876_543_210_987;
    expect(gridIndex(gridDigits(i, big), big)).toBe(i);
  });

  it('round-trips random indices of random grids (property test)', () => {
    fc.assert(
      fc.property(
        fc
          .array(fc.integer({ min: 1, max: 10000 }), { minLength: 1, maxLength: 6 })
          .chain((radices) =>
            fc.tuple(
              fc.constant(radices),
              fc.integer({ min: 0, max: Math.min(Number.MAX_SAFE_INTEGER, gridSize(radices)) - 1 }),
            ),
          ),
        ([radices, i]) => {
          const d = gridDigits(i, radices);
          return gridIndex(d, radices) === i && Array.from(d).every((x, a) => x >= 0 && x < radices[a]!);
        },
      ),
    );
  });
});
