import { describe, expect, it } from 'vitest';
import { contourLines, contourSegments, type GridField } from './contour.js';

/*
 * Marching squares checked on analytic fields whose level sets are known in closed form (common practice:
 * the contour z = 1 of z = x·y is the hyperbola y = 1/x; of z = x² + y² the unit circle).
 */

const linspace = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));
const logspace = (a: number, b: number, n: number) => linspace(Math.log10(a), Math.log10(b), n).map((e) => 10 ** e);

function sample(xs: number[], ys: number[], f: (x: number, y: number) => number): GridField {
  return { xs, ys, z: ys.map((y) => xs.map((x) => f(x, y))) };
}

describe('contourSegments on z = x·y (level 1: the hyperbola y = 1/x)', () => {
  const xs = linspace(0.2, 5, 37);
  const ys = linspace(0.2, 5, 41);
  const field = sample(xs, ys, (x, y) => x * y);

  it('puts every crossing on the hyperbola (the field is bilinear, so edge interpolation is exact)', () => {
    const segs = contourSegments(field, 1);
    expect(segs.length).toBeGreaterThan(20);
    for (const s of segs) for (const [x, y] of s) expect(x * y).toBeCloseTo(1, 10);
  });

  it('joins the crossings into one polyline running from one edge of the grid to the other', () => {
    const lines = contourLines(field, 1);
    expect(lines).toHaveLength(1);
    const line = lines[0]!;
    const xsOnLine = line.map((p) => p[0]).sort((a, b) => a - b);
    // y = 1/x leaves the box [0.2, 5]² at x = 0.2 (y = 5) and x = 5 (y = 0.2).
    expect(xsOnLine[0]).toBeCloseTo(0.2, 10);
    expect(xsOnLine.at(-1)).toBeCloseTo(5, 10);
    // Consecutive points are neighbours: no jump longer than a cell diagonal.
    const h = Math.hypot(xs[1]! - xs[0]!, ys[1]! - ys[0]!);
    for (let k = 1; k < line.length; k++)
      expect(Math.hypot(line[k]![0] - line[k - 1]![0], line[k]![1] - line[k - 1]![1])).toBeLessThanOrEqual(h + 1e-12);
  });

  it('finds both branches of x·y = 0.5 on a grid that straddles the origin', () => {
    const f = sample(linspace(-2, 2, 33), linspace(-2, 2, 29), (x, y) => x * y);
    const lines = contourLines(f, 0.5);
    expect(lines).toHaveLength(2);
    const quadrants = lines.map((l) => Math.sign(l[0]![0]) * 10 + Math.sign(l[0]![1])).sort();
    expect(quadrants).toEqual([-11, 11]);
    for (const l of lines) for (const [x, y] of l) expect(x * y).toBeCloseTo(0.5, 10);
  });
});

describe('contourSegments on z = x² + y² (level 1: the unit circle)', () => {
  it('stays within the linear-interpolation error bound, which shrinks as h²', () => {
    const worst = (n: number) => {
      const xs = linspace(-1.5, 1.5, n);
      const f = sample(xs, xs, (x, y) => x * x + y * y);
      const segs = contourSegments(f, 1);
      let err = 0;
      for (const s of segs) for (const [x, y] of s) err = Math.max(err, Math.abs(Math.hypot(x, y) - 1));
      return { err, h: xs[1]! - xs[0]! };
    };
    const coarse = worst(16);
    const fine = worst(61);
    // Along an edge the field is quadratic with z'' = 2 and |z'| ≥ 2·0.7 near the circle: the crossing is off
    // by at most h²·max|z''|/(8·min|z'|) < h²/4.
    expect(coarse.err).toBeLessThan(coarse.h ** 2 / 4);
    expect(fine.err).toBeLessThan(fine.h ** 2 / 4);
    expect(fine.err).toBeLessThan(coarse.err);
  });

  it('closes on itself', () => {
    const xs = linspace(-1.5, 1.5, 30);
    const lines = contourLines(
      sample(xs, xs, (x, y) => x * x + y * y),
      1,
    );
    expect(lines).toHaveLength(1);
    const l = lines[0]!;
    expect(l[0]).toEqual(l.at(-1));
  });
});

describe('log axes and a log field', () => {
  // ρ_i/L_n ∝ √T_i / B: a power law, so log10 z is linear in log10 x and log10 y.
  const xs = logspace(1, 1000, 25);
  const ys = logspace(0.05, 5, 21);
  const f = sample(xs, ys, (x, y) => (0.01 * Math.sqrt(x)) / y);
  const onCurve = (x: number, y: number) => (0.01 * Math.sqrt(x)) / y;

  it('is exact for a power law when interpolating in log10 of x, y and z', () => {
    const segs = contourSegments(f, 0.1, { logX: true, logY: true, logZ: true });
    expect(segs.length).toBeGreaterThan(10);
    for (const s of segs) for (const [x, y] of s) expect(onCurve(x, y)).toBeCloseTo(0.1, 10);
  });

  it('is only approximate with linear interpolation on the same grid', () => {
    const segs = contourSegments(f, 0.1);
    const err = Math.max(...segs.flat().map(([x, y]) => Math.abs(onCurve(x, y) - 0.1)));
    expect(err).toBeGreaterThan(1e-6);
  });

  it('returns nothing for a non-positive level on a log field', () => {
    expect(contourSegments(f, 0, { logZ: true })).toEqual([]);
  });
});

describe('missing values', () => {
  it('skips cells with a missing corner and leaves the rest of the line', () => {
    const xs = linspace(0.2, 5, 21);
    const f = sample(xs, xs, (x, y) => x * y);
    const full = contourSegments(f, 1).length;
    const holed: GridField = { ...f, z: f.z.map((row, j) => row.map((v, i) => (i === 10 && j === 1 ? null : v))) };
    const segs = contourSegments(holed, 1);
    expect(segs.length).toBeLessThan(full);
    expect(segs.length).toBeGreaterThan(0);
  });

  it('draws nothing when the level is outside the data', () => {
    const xs = linspace(1, 2, 5);
    expect(
      contourSegments(
        sample(xs, xs, (x, y) => x * y),
        10,
      ),
    ).toEqual([]);
  });
});
