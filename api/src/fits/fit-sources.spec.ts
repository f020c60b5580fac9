import { describe, expect, it } from 'vitest';
import { datasetMask, dropMissing, requestedColumns } from './fit-sources.js';

describe('fit data extraction helpers', () => {
  it('drops rows with NaN or ±∞ in any used column and counts them', () => {
    const data = {
      y: Float64Array.of(1, NaN, 3, 4, 5),
      x: Float64Array.of(1, 2, Infinity, 4, 5),
      unused: Float64Array.of(NaN, NaN, NaN, NaN, NaN),
    };
    const r = dropMissing(5, data, ['y', 'x']);
    expect(r.n).toBe(3);
    expect(r.dropped).toBe(2);
    expect([...r.data.y!]).toEqual([1, 4, 5]);
    expect([...r.data.x!]).toEqual([1, 4, 5]);
  });

  it('applies the sweep filter JSON to dataset columns (gte, lt, eq with booleans as 0/1)', () => {
    const data = { phi: Float64Array.of(-5, -1, 0, 2, 4), ok: Float64Array.of(1, 1, 0, 1, 1) };
    expect([...datasetMask(5, data, { phi: { gte: -1, lt: 4 } })]).toEqual([0, 1, 1, 1, 0]);
    expect([...datasetMask(5, data, { ok: { eq: true }, phi: { gt: -5 } })]).toEqual([0, 1, 0, 1, 1]);
    // NaN never satisfies a range.
    expect([...datasetMask(2, { phi: Float64Array.of(NaN, 1) }, { phi: { lte: 5 } })]).toEqual([0, 1]);
    expect(() => datasetMask(1, { phi: Float64Array.of(1) }, { phi: { eq: 'a' } })).toThrow(/numbers/);
  });

  it('names each requested column by its request path', () => {
    expect(requestedColumns({ y: 'n', x: ['a', 'b'], weights: 's' })).toEqual([
      { path: 'y', name: 'n' },
      { path: 'x.0', name: 'a' },
      { path: 'x.1', name: 'b' },
      { path: 'weights', name: 's' },
    ]);
    expect(requestedColumns({ y: 'n', x: 'phi' })).toEqual([
      { path: 'y', name: 'n' },
      { path: 'x', name: 'phi' },
    ]);
  });
});
