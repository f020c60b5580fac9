import { describe, expect, it } from 'vitest';
import type { DatasetColumn, DatasetSeries } from '@driftgrid/domain';
import {
  defaultOverlayColumns,
  describeUnit,
  numericColumns,
  overlaySummary,
  planOverlay,
  sameUnit,
  unitMismatches,
  unitPowers,
} from './overlay.js';

// Canonical units as the api stores them (api/src/datasets/column-units.ts: SI, T in eV); the
// equivalences below are plain SI notation (common practice: V/m ≡ V·m⁻¹, m⁻³ ≡ 1/m³).
const col = (name: string, canonicalUnit: string, kind: DatasetColumn['kind'] = 'number'): DatasetColumn => ({
  name,
  kind,
  unit: canonicalUnit,
  canonicalUnit,
  quantity: null,
});

const plot = { x: { name: 'Te', unit: 'eV' }, y: { name: 'vDi_ms', unit: 'm/s' } };

function series(
  x: [string, string],
  y: [string, string],
  xs: number[],
  ys: number[],
  total = xs.length,
): DatasetSeries {
  return {
    x: { name: x[0], unit: x[1], quantity: null },
    y: { name: y[0], unit: y[1], quantity: null },
    n: xs.length,
    total,
    points: { x: xs, y: ys },
  };
}

describe('unit comparison', () => {
  it('treats different spellings of one unit as equal', () => {
    expect(sameUnit('V/m', 'V / m')).toBe(true);
    expect(sameUnit('V/m', 'V m^-1')).toBe(true);
    expect(sameUnit('m^-3', '1 / m^3')).toBe(true);
    expect(sameUnit('kg m^2 / s^2', 'kg*m^2/s^2')).toBe(true);
    expect(sameUnit('A/m^2', 'A m^-2')).toBe(true);
    expect(sameUnit('rad/s', 'rad / s')).toBe(true);
  });

  it('treats 1, empty and dimensionless as no unit', () => {
    expect(sameUnit('1', '')).toBe(true);
    expect(sameUnit('dimensionless', '1')).toBe(true);
    expect(unitPowers('m/m').size).toBe(0);
    expect(describeUnit('')).toBe('dimensionless');
    expect(describeUnit('m/s')).toBe('m/s');
  });

  it('tells different units apart', () => {
    expect(sameUnit('eV', 'V')).toBe(false);
    expect(sameUnit('m', 'm^-1')).toBe(false);
    expect(sameUnit('m^-3', 'm^3')).toBe(false);
    expect(sameUnit('m/s', 'm s')).toBe(false);
    expect(sameUnit('1', 'm')).toBe(false);
    expect(sameUnit('T', 'Wb')).toBe(false);
  });
});

describe('default overlay columns', () => {
  it('picks the numeric columns whose units match the plot axes, skipping text', () => {
    const cols = [col('probe', '', 'text'), col('r', 'm'), col('v', 'm/s'), col('T_probe', 'eV')];
    expect(defaultOverlayColumns(cols, { xUnit: 'eV', yUnit: 'm/s' })).toEqual({ x: 'T_probe', y: 'v' });
    expect(numericColumns(cols).map((c) => c.name)).toEqual(['r', 'v', 'T_probe']);
  });

  it('does not put the same column on both axes when another exists', () => {
    const cols = [col('a', 'V'), col('b', 'V')];
    expect(defaultOverlayColumns(cols, { xUnit: 'V', yUnit: 'V' })).toEqual({ x: 'a', y: 'b' });
  });

  it('falls back to the first numeric columns when nothing matches, and to null without numbers', () => {
    expect(defaultOverlayColumns([col('r', 'm'), col('n', 'm^-3')], { xUnit: 'eV', yUnit: 'm/s' })).toEqual({
      x: 'r',
      y: 'n',
    });
    expect(defaultOverlayColumns([col('only', 'm')], { xUnit: 'm', yUnit: 'eV' })).toEqual({ x: 'only', y: 'only' });
    expect(defaultOverlayColumns([col('label', '', 'text')], { xUnit: 'm', yUnit: 'eV' })).toEqual({
      x: null,
      y: null,
    });
  });
});

describe('overlay plan', () => {
  it('names each axis whose units differ and draws nothing', () => {
    const s = series(['r', 'm'], ['v', 'm/s'], [1, 2], [3, 4]);
    expect(unitMismatches(s, plot)).toEqual(["the dataset's x (r) is in m, the plot's x (Te) is in eV"]);
    const p = planOverlay(s, plot, { x: false, y: false });
    expect(p.ok).toBe(false);
    if (!p.ok) expect(p.mismatches).toHaveLength(1);
    const both = planOverlay(series(['r', 'm'], ['n', 'm^-3'], [1], [1]), plot, { x: false, y: false });
    expect(both.ok ? [] : both.mismatches).toEqual([
      "the dataset's x (r) is in m, the plot's x (Te) is in eV",
      "the dataset's y (n) is in m^-3, the plot's y (vDi_ms) is in m/s",
    ]);
  });

  it('keeps every point on linear axes, including negative ones', () => {
    const p = planOverlay(series(['T', 'eV'], ['v', 'm / s'], [-1, 0, 2], [5, -3, 7]), plot, { x: false, y: false });
    expect(p).toEqual({
      ok: true,
      points: [
        [-1, 5],
        [0, -3],
        [2, 7],
      ],
      dropped: 0,
      thinned: false,
      total: 3,
    });
  });

  it('drops non-positive values on log axes and counts them', () => {
    const s = series(['T', 'eV'], ['v', 'm/s'], [-1, 0, 2, 3, 4], [5, 1, -7, 0, 9]);
    const logX = planOverlay(s, plot, { x: true, y: false });
    expect(logX.ok && logX.points).toEqual([
      [2, -7],
      [3, 0],
      [4, 9],
    ]);
    expect(logX.ok && logX.dropped).toBe(2);
    const logBoth = planOverlay(s, plot, { x: true, y: true });
    expect(logBoth.ok && logBoth.points).toEqual([[4, 9]]);
    expect(logBoth.ok && logBoth.dropped).toBe(4);
    if (logBoth.ok)
      expect(overlaySummary(logBoth, 'Probe scan')).toBe(
        '1 point of “Probe scan” drawn; 4 points with a value ≤ 0 left out on the log axis.',
      );
  });

  it('says when the api thinned the dataset', () => {
    const p = planOverlay(series(['T', 'eV'], ['v', 'm/s'], [1, 2], [3, 4], 10), plot, { x: false, y: false });
    expect(p.ok && p.thinned).toBe(true);
    if (p.ok)
      expect(overlaySummary(p, 'Probe scan')).toBe('2 points of “Probe scan” drawn (evenly thinned from 10 rows).');
  });
});
