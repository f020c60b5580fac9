import { describe, expect, it } from 'vitest';
import { gridStrides, sliceIndices, strideDigits } from './grid-index.js';

describe('grid index arithmetic', () => {
  it('gives row-major strides with the last axis fastest', () => {
    expect(gridStrides([31, 50, 3, 3])).toEqual([450, 9, 3, 1]);
    expect(gridStrides([7])).toEqual([1]);
  });

  it('spreads at most maxValues digits over an axis, keeping both ends', () => {
    expect(strideDigits(5, 10)).toEqual([0, 1, 2, 3, 4]);
    const d = strideDigits(1_000_000, 2000);
    expect(d.length).toBe(2000);
    expect(d[0]).toBe(0);
    expect(d.at(-1)).toBe(999_999);
    expect(d.every((v, i) => i === 0 || v > d[i - 1])).toBe(true);
    expect(strideDigits(9, 1)).toEqual([0]);
  });

  it('enumerates a slice: free axes vary, the others stay at their fixed digits', () => {
    const strides = gridStrides([3, 4, 2]);
    // Axis 0 free, axis 1 fixed at 2, axis 2 fixed at 1: idx = a·8 + 2·2 + 1.
    expect(sliceIndices(strides, [0, 2, 1], [{ axis: 0, digits: [0, 1, 2] }])).toEqual([5, 13, 21]);
    // Axes 0 and 2 free, axis 1 at 3.
    expect(
      sliceIndices(
        strides,
        [0, 3, 0],
        [
          { axis: 0, digits: [0, 2] },
          { axis: 2, digits: [0, 1] },
        ],
      ),
    ).toEqual([6, 7, 22, 23]);
  });
});
