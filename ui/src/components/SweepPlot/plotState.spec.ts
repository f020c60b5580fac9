import { describe, expect, it } from 'vitest';
import { drawnGroups, heldAxes, readPlotState, seriesQuery, writePlotState, type PlotContext } from './plotState.js';

const values = (n: number) => Array.from({ length: n }, (_, i) => i + 1);
const ctx: PlotContext = {
  axes: [
    { param: 'Te_eV', unit: 'eV', kind: 'log', count: 7, values: values(7) },
    { param: 'B_T', unit: 'T', kind: 'linear', count: 30, values: values(30) },
    { param: 'Ln_m', unit: 'm', kind: 'list', count: 3, values: values(3) },
  ],
  grid: true,
  numeric: ['Te_eV', 'B_T', 'Ln_m', 'rho_i_over_Ln', 'vDi_ms'],
  preferred: 'rho_i_over_Ln',
};
const read = (q: string, c: PlotContext = ctx) => readPlotState(new URLSearchParams(q), c);

describe('plot state in the URL', () => {
  it('defaults to a heatmap over the first two axes of a grid, the third held at its first value', () => {
    const s = read('');
    expect(s).toMatchObject({ kind: 'heatmap', x: 'Te_eV', y: 'B_T', z: 'rho_i_over_Ln', mean: false });
    expect(heldAxes(s, ctx).map((a) => a.param)).toEqual(['Ln_m']);
    expect(seriesQuery(s, ctx)).toMatchObject({ kind: 'heatmap', 'slice.Ln_m': 0, z: 'rho_i_over_Ln' });
  });

  it('defaults to a scatter for random designs, with no slice pickers', () => {
    const s = read('', { ...ctx, grid: false, axes: ctx.axes.map((a) => ({ ...a, values: null })) });
    expect(s.kind).toBe('scatter');
    expect(heldAxes(s, { ...ctx, grid: false })).toEqual([]);
    expect(seriesQuery(s, ctx)).toBeNull();
  });

  it('round-trips a state through the URL and keeps other parameters', () => {
    const s = { ...read('plot=line&x=Te_eV&by=B_T&z=vDi_ms'), groups: [0, 5, 29], slice: { Ln_m: 2 } };
    const url = writePlotState(new URLSearchParams('tab=plots'), s);
    expect(url.get('tab')).toBe('plots');
    expect(url.get('g')).toBe('0,5,29');
    expect(url.get('at.Ln_m')).toBe('2');
    expect(read(url.toString())).toEqual(s);
  });

  it('ignores slice values and groups outside the grid, and unknown columns', () => {
    const s = read('plot=line&x=Te_eV&by=B_T&g=3,30,-1,abc,3&at.Ln_m=3&at.B_T=1.5&z=nope');
    expect(s.groups).toEqual([3]);
    expect(s.slice).toEqual({});
    expect(s.z).toBe('rho_i_over_Ln');
  });

  it('draws 8 evenly spread values of a 30-valued grouping by default, and the picked ones otherwise', () => {
    const s = read('plot=line&x=Te_eV&by=B_T');
    const d = drawnGroups(s, ctx);
    expect(d).toMatchObject({ count: 30, all: false });
    expect(d.digits).toHaveLength(8);
    expect(d.digits[0]).toBe(0);
    expect(d.digits.at(-1)).toBe(29);
    expect(seriesQuery(s, ctx)).toMatchObject({ groupBy: 'B_T', groups: d.digits.join(','), 'slice.Ln_m': 0 });
    const picked = read('plot=line&x=Te_eV&by=B_T&g=2,4&at.Ln_m=1');
    expect(seriesQuery(picked, ctx)).toMatchObject({ groups: '2,4', 'slice.Ln_m': 1 });
    // A grouping with few values draws them all.
    expect(drawnGroups(read('plot=line&x=B_T&by=Ln_m'), ctx)).toMatchObject({ digits: [0, 1, 2], all: true });
  });

  it('averages instead of slicing when asked (heatmaps only)', () => {
    const s = read('plot=heatmap&x=Te_eV&y=Ln_m&avg=1&at.B_T=4');
    const q = seriesQuery(s, ctx)!;
    expect(q.agg).toBe('mean');
    expect(q['slice.B_T']).toBeUndefined();
    expect(read('plot=line&avg=1').mean).toBe(false);
  });

  it('reads strided points, without slices, when a line is drawn against an output', () => {
    const s = read('plot=line&x=vDi_ms&z=rho_i_over_Ln');
    expect(heldAxes(s, ctx)).toEqual([]);
    expect(s.groupBy).toBeNull();
    expect(seriesQuery(s, ctx)).toEqual({ kind: 'line', x: 'vDi_ms', y: 'rho_i_over_Ln', maxPoints: 2000 });
  });

  it('keeps explicit scale choices; absent means automatic', () => {
    expect(read('logx=0&logz=1').log).toEqual({ x: false, y: undefined, z: true });
  });
});
