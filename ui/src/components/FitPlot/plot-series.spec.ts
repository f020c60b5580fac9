import { describe, expect, it } from 'vitest';
import { fitPlotSeries } from './plot-series.js';

describe('fit plot series', () => {
  it('one x: data, a fitted curve in x order and residuals against x', () => {
    const s = fitPlotSeries(
      {
        xNames: ['phi'],
        x: { phi: [3, 1, 2, null] },
        y: [9, 1, 4, 5],
        fitted: [9.1, 1.1, 3.9, 5],
        residuals: [-0.1, -0.1, 0.1, 0],
        total: 4,
        shown: 4,
      },
      'n',
    );
    expect(s.kind).toBe('curve');
    expect(s.observed).toEqual([
      [3, 9],
      [1, 1],
      [2, 4],
    ]);
    expect(s.fitted.map((p) => p[0])).toEqual([1, 2, 3]);
    expect(s.residuals).toHaveLength(3);
    expect(s.logOk).toBe(true);
  });

  it('several x: predicted against observed, |y| when y is negative everywhere so log–log works', () => {
    const s = fitPlotSeries(
      {
        xNames: ['a', 'b'],
        x: { a: [1, 2], b: [3, 4] },
        y: [-2, -8],
        fitted: [-2.1, -7.9],
        residuals: [0.1, -0.1],
        total: 2,
        shown: 2,
      },
      'vDi_ms',
    );
    expect(s.kind).toBe('parity');
    expect(s.observed).toEqual([
      [2, 2.1],
      [8, 7.9],
    ]);
    expect(s.xLabel).toBe('observed |vDi_ms|');
    expect(s.fitted).toEqual([
      [2, 2],
      [8, 8],
    ]);
    expect(s.logOk).toBe(true);
    expect(s.residuals).toEqual([
      [-2.1, 0.1],
      [-7.9, -0.1],
    ]);
  });

  it('no log axes for values of both signs', () => {
    const s = fitPlotSeries(
      {
        xNames: ['a', 'b'],
        x: { a: [1, 2], b: [1, 2] },
        y: [-1, 2],
        fitted: [-1, 2],
        residuals: [0, 0],
        total: 2,
        shown: 2,
      },
      'y',
    );
    expect(s.logOk).toBe(false);
  });
});
