import { describe, expect, it } from 'vitest';
import type { FitView } from '../../api/fits.js';
import { bestBy, residualSeries, sameData } from './compare-series.js';

const fit = (id: number, over: Partial<FitView>): FitView =>
  ({
    id,
    model: 'expression',
    source: { kind: 'dataset', id: 1, name: 'd' },
    y: 'y',
    plot: {
      xNames: ['x'],
      x: { x: [1, 2, 3] },
      y: [1, 2, 3],
      fitted: [1, 2, 3],
      residuals: [0.1, null, -0.1],
      total: 3,
      shown: 3,
    },
    ...over,
  }) as FitView;

describe('fit comparison', () => {
  it('puts every fit of the same data on its shared x axis, skipping missing residuals', () => {
    const r = residualSeries([fit(1, {}), fit(2, {})]);
    expect(r).toMatchObject({ axis: 'x', shared: true });
    expect(r.series[0]!.data).toEqual([
      [1, 0.1],
      [3, -0.1],
    ]);
  });
  it('falls back to the fitted value when the x columns differ, and says the data differ', () => {
    const other = fit(2, {
      y: 'z',
      plot: { xNames: ['t'], x: { t: [5] }, y: [1], fitted: [7], residuals: [2], total: 1, shown: 1 },
    });
    expect(residualSeries([fit(1, {}), other]).axis).toBe('fitted value');
    expect(sameData([fit(1, {}), other])).toBe(false);
  });
  it('marks the lowest AIC', () => {
    expect(bestBy([fit(1, { aic: 5 }), fit(2, { aic: -3 }), fit(3, { aic: null })], 'aic')).toBe(1);
  });
});
