import { readFileSync } from 'node:fs';
import { jStat } from 'jstat';
import { describe, expect, it } from 'vitest';
import { fitModel } from './fit-model.js';
import type { FitResult } from './types.js';

/** Seeded PRNG (mulberry32, common practice) with Box–Muller normal deviates. */
function normalSource(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform());
}

const byName = (r: FitResult, name: string) => r.parameters.find((p) => p.name === name)!;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

// A straight line with per-point σ (invented deuterium edge calibration, arbitrary units).
const noise = normalSource(4242);
const x = Array.from({ length: 25 }, (_, i) => 0.5 + 0.4 * i);
const sigma = x.map((xi) => 0.05 + 0.02 * xi);
const y = x.map((xi, i) => 1.7 + 0.83 * xi + sigma[i]! * noise());

/**
 * Weighted linear least squares in closed form (any statistics text, e.g. Bevington & Robinson §6):
 * S = Σw, Sx = Σwx, Sxx = Σwx², Δ = S·Sxx − Sx², w = 1/σ²; (JᵀWJ)⁻¹ = [[Sxx, −Sx], [−Sx, S]]/Δ.
 * This is the covariance curve_fit(absolute_sigma=True) defines: σ_p = sqrt(diag((JᵀWJ)⁻¹)).
 */
function weightedLine(w: number[]) {
  let S = 0;
  let Sx = 0;
  let Sxx = 0;
  let Sy = 0;
  let Sxy = 0;
  w.forEach((wi, i) => {
    S += wi;
    Sx += wi * x[i]!;
    Sxx += wi * x[i]! ** 2;
    Sy += wi * y[i]!;
    Sxy += wi * x[i]! * y[i]!;
  });
  const D = S * Sxx - Sx * Sx;
  const a = (Sxx * Sy - Sx * Sxy) / D;
  const b = (S * Sxy - Sx * Sy) / D;
  const chi2 = w.reduce((s, wi, i) => s + wi * (y[i]! - a - b * x[i]!) ** 2, 0);
  return { a, b, varA: Sxx / D, varB: S / D, covAB: -Sx / D, chi2, S, Sx, Sxx };
}

describe('absolute and relative σ (curve_fit absolute_sigma definition, exact for a linear model)', () => {
  const ref = weightedLine(sigma.map((s) => 1 / (s * s)));
  const dof = x.length - 2;

  it('absolute: standard errors are sqrt(diag((JᵀWJ)⁻¹)), unscaled, to 1e-9', () => {
    const r = fitModel({
      model: 'expression',
      expr: 'a + b*x',
      x: { x },
      xNames: ['x'],
      y,
      sigma,
      params: { a: 1, b: 1 },
      sigmaMode: 'absolute',
    });
    expect(r.converged).toBe(true);
    expect(r.sigmaMode).toBe('absolute');
    expect(rel(byName(r, 'a').value, ref.a)).toBeLessThan(1e-9);
    expect(rel(byName(r, 'b').value, ref.b)).toBeLessThan(1e-9);
    expect(rel(byName(r, 'a').stdError, Math.sqrt(ref.varA))).toBeLessThan(1e-9);
    expect(rel(byName(r, 'b').stdError, Math.sqrt(ref.varB))).toBeLessThan(1e-9);
    expect(rel(r.covariance[0]![1]!, ref.covAB)).toBeLessThan(1e-9);
    // Correlation of intercept and slope: −Sx/sqrt(S·Sxx).
    expect(r.correlation[0]![1]).toBeCloseTo(-ref.Sx / Math.sqrt(ref.S * ref.Sxx), 10);
    expect(r.correlation[0]![0]).toBeCloseTo(1, 12);
    // χ² and its upper-tail p-value; reference: 1 − jStat.chisquare.cdf (jStat 1.9.6, npm).
    expect(rel(r.chi2!, ref.chi2)).toBeLessThan(1e-9);
    expect(r.chi2PValue!).toBeCloseTo(1 - jStat.chisquare.cdf(ref.chi2, dof), 8);
  });

  it('relative (the default): the same covariance scaled by the reduced χ²', () => {
    const r = fitModel({
      model: 'expression',
      expr: 'a + b*x',
      x: { x },
      xNames: ['x'],
      y,
      sigma,
      params: { a: 1, b: 1 },
    });
    expect(r.sigmaMode).toBe('relative');
    const s2 = ref.chi2 / dof;
    expect(rel(r.chi2red!, s2)).toBeLessThan(1e-9);
    expect(rel(byName(r, 'a').stdError, Math.sqrt(ref.varA * s2))).toBeLessThan(1e-9);
    expect(rel(byName(r, 'b').stdError, Math.sqrt(ref.varB * s2))).toBeLessThan(1e-9);
  });

  it('refuses absolute σ without a σ column, naming the field', () => {
    expect(() =>
      fitModel({
        model: 'expression',
        expr: 'a + b*x',
        x: { x },
        xNames: ['x'],
        y,
        params: { a: 1, b: 1 },
        sigmaMode: 'absolute',
      }),
    ).toThrow(/sigmaMode/);
  });
});

describe('fixed parameters', () => {
  it('a fixed slope: the intercept is the weighted mean of y − b·x, stdError 0, dof counts free parameters only', () => {
    const b0 = 0.8;
    const w = sigma.map((s) => 1 / (s * s));
    const S = w.reduce((s, v) => s + v, 0);
    const a = w.reduce((s, wi, i) => s + wi * (y[i]! - b0 * x[i]!), 0) / S;
    const chi2 = w.reduce((s, wi, i) => s + wi * (y[i]! - a - b0 * x[i]!) ** 2, 0);
    const r = fitModel({
      model: 'expression',
      expr: 'a + b*x',
      x: { x },
      xNames: ['x'],
      y,
      sigma,
      params: { a: 1 },
      fixed: { b: b0 },
    });
    expect(r.converged).toBe(true);
    expect(r.dof).toBe(x.length - 1);
    expect(r.parameters.map((p) => [p.name, p.fixed])).toEqual([
      ['a', false],
      ['b', true],
    ]);
    expect(byName(r, 'b')).toMatchObject({ value: b0, stdError: 0, fixed: true });
    expect(rel(byName(r, 'a').value, a)).toBeLessThan(1e-9);
    // Relative σ: var(a) = (χ²/(n − 1))/S.
    expect(rel(byName(r, 'a').stdError, Math.sqrt(chi2 / (x.length - 1) / S))).toBeLessThan(1e-9);
    expect(r.covariance[1]).toEqual([0, 0]);
    expect(r.correlation[0]![1]).toBeNaN();
    // AIC/BIC count one free parameter: n·ln(χ²/n) + 2k and + k·ln n.
    const n = x.length;
    expect(r.aic).toBeCloseTo(n * Math.log(chi2 / n) + 2, 8);
    expect(r.bic).toBeCloseTo(n * Math.log(chi2 / n) + Math.log(n), 8);
  });

  it('a fixed parameter of a built-in model (polytropic γ = 1 is the Boltzmann fit)', () => {
    const phi = Array.from({ length: 40 }, (_, i) => -10 + i * 0.3);
    const dens = phi.map((p) => 2e17 * Math.exp(p / 3.5));
    const r = fitModel({ model: 'polytropic', x: { phi }, xNames: ['phi'], y: dens, fixed: { gamma: 1 } });
    expect(r.converged).toBe(true);
    expect(byName(r, 'gamma')).toMatchObject({ value: 1, fixed: true, stdError: 0 });
    expect(rel(byName(r, 'Te_eV').value, 3.5)).toBeLessThan(1e-8);
    expect(r.dof).toBe(38);
  });

  it('refuses a fixed name the model does not have, all parameters fixed, and fixed with bounds', () => {
    const base = { model: 'expression' as const, expr: 'a + b*x', x: { x }, xNames: ['x'], y, params: { a: 1, b: 1 } };
    expect(() => fitModel({ model: 'exponential', x: { x }, xNames: ['x'], y, fixed: { q: 1 } })).toThrow(/fixed\.q/);
    expect(() => fitModel({ ...base, fixed: { a: 1, b: 1 } })).toThrow(/at least one free/);
    expect(() => fitModel({ ...base, fixed: { a: 1 }, bounds: { a: { min: 0 } } })).toThrow(/fixed\.a/);
  });
});

/**
 * Bounded fits. Reference optima are derived analytically: each problem below is a strictly convex
 * quadratic in the parameters (linear model) or reduces to one with the bound active, so its bounded
 * minimiser is unique and is what SciPy's least_squares(bounds=…) returns; the KKT conditions give it in
 * closed form (active parameter at its bound, free ones the least-squares solution with it held there,
 * gradient pointing out of the box).
 */
describe('bounded parameters: the bounded optimum to 1e-6', () => {
  it('linear: slope bounded above its free value sits on the bound, intercept = mean(y − hi·x)', () => {
    const free = weightedLine(x.map(() => 1));
    const hi = free.b - 0.05;
    const a = y.reduce((s, yi, i) => s + yi - hi * x[i]!, 0) / x.length;
    const r = fitModel({
      model: 'expression',
      expr: 'a + b*x',
      x: { x },
      xNames: ['x'],
      y,
      params: { a: 1, b: 0.5 },
      bounds: { b: { min: 0, max: hi } },
    });
    expect(r.converged).toBe(true);
    expect(rel(byName(r, 'b').value, hi)).toBeLessThan(1e-6);
    expect(rel(byName(r, 'a').value, a)).toBeLessThan(1e-6);
    expect(r.message).toMatch(/at a bound: b/);
    // KKT: at b = hi, ∂RSS/∂b < 0 (the sum of squares would still fall above the bound).
    const grad = y.reduce((s, yi, i) => s - 2 * x[i]! * (yi - a - hi * x[i]!), 0);
    expect(grad).toBeLessThan(0);
  });

  it('quadratic: curvature bounded at ≥ 0 for concave data gives the best straight line', () => {
    const xs = Array.from({ length: 30 }, (_, i) => i / 29);
    const ys = xs.map((v) => 1 + 2 * v - 0.6 * v * v);
    // With c2 = 0 active the optimum is the unweighted least-squares line through (xs, ys).
    const n = xs.length;
    const mx = xs.reduce((s, v) => s + v, 0) / n;
    const my = ys.reduce((s, v) => s + v, 0) / n;
    const c1 = xs.reduce((s, v, i) => s + (v - mx) * (ys[i]! - my), 0) / xs.reduce((s, v) => s + (v - mx) ** 2, 0);
    const c0 = my - c1 * mx;
    const r = fitModel({
      model: 'expression',
      expr: 'c0 + c1*x + c2*x^2',
      x: { x: xs },
      xNames: ['x'],
      y: ys,
      params: { c0: 0, c1: 1, c2: 0.5 },
      bounds: { c2: { min: 0 } },
    });
    expect(r.converged).toBe(true);
    expect(Math.abs(byName(r, 'c2').value)).toBeLessThan(1e-12);
    expect(rel(byName(r, 'c0').value, c0)).toBeLessThan(1e-6);
    expect(rel(byName(r, 'c1').value, c1)).toBeLessThan(1e-6);
  });

  it('nonlinear: Boltzmann scale bounded below its free value; A is then linear, A = Σ y·e / Σ e²', () => {
    const phi = Array.from({ length: 30 }, (_, i) => -12 + 0.4 * i);
    const n0 = phi.map((p, i) => 5 * Math.exp(p / 4) * (1 + 0.02 * Math.sin(3 * i)));
    const cap = 3.2;
    const e = phi.map((p) => Math.exp(p / cap));
    const A = n0.reduce((s, v, i) => s + v * e[i]!, 0) / e.reduce((s, v) => s + v * v, 0);
    const r = fitModel({
      model: 'exponential',
      x: { phi },
      xNames: ['phi'],
      y: n0,
      params: { s: 3 },
      bounds: { s: { max: cap } },
    });
    expect(r.converged).toBe(true);
    expect(rel(byName(r, 's').value, cap)).toBeLessThan(1e-6);
    expect(rel(byName(r, 'A').value, A)).toBeLessThan(1e-6);
  });

  it('an inactive bound changes nothing', () => {
    const free = fitModel({ model: 'expression', expr: 'a + b*x', x: { x }, xNames: ['x'], y, params: { a: 1, b: 1 } });
    const boxed = fitModel({
      model: 'expression',
      expr: 'a + b*x',
      x: { x },
      xNames: ['x'],
      y,
      params: { a: 1, b: 1 },
      bounds: { b: { min: -10, max: 10 } },
    });
    expect(rel(byName(boxed, 'b').value, byName(free, 'b').value)).toBeLessThan(1e-9);
    expect(rel(byName(boxed, 'b').stdError, byName(free, 'b').stdError)).toBeLessThan(1e-6);
  });
});

describe('information criteria compare models of the same data', () => {
  it('curved data: the quadratic has the lower AIC and BIC than the line; each matches its definition', () => {
    const noiseQ = normalSource(77);
    const xs = Array.from({ length: 40 }, (_, i) => i / 39);
    const ys = xs.map((v) => 1 + 2 * v - 1.5 * v * v + 0.01 * noiseQ());
    const line = fitModel({
      model: 'expression',
      expr: 'c0 + c1*x',
      x: { x: xs },
      xNames: ['x'],
      y: ys,
      params: { c0: 0, c1: 1 },
    });
    const quad = fitModel({
      model: 'expression',
      expr: 'c0 + c1*x + c2*x^2',
      x: { x: xs },
      xNames: ['x'],
      y: ys,
      params: { c0: 0, c1: 1, c2: 0 },
    });
    expect(quad.aic).toBeLessThan(line.aic - 10);
    expect(quad.bic).toBeLessThan(line.bic - 10);
    const n = xs.length;
    for (const [r, k] of [
      [line, 2],
      [quad, 3],
    ] as const) {
      const rss = r.residuals.reduce((s, v) => s + v * v, 0);
      expect(r.aic).toBeCloseTo(n * Math.log(rss / n) + 2 * k, 8);
      expect(r.bic).toBeCloseTo(n * Math.log(rss / n) + k * Math.log(n), 8);
    }
  });
});

describe('convergence advice', () => {
  const dir = new URL('../../../tests/reference/strd/', import.meta.url);
  const rows = readFileSync(new URL('BoxBOD_data.csv', dir), 'utf8')
    .trim()
    .split(/\r?\n/)
    .slice(1)
    .map((l) => l.split(',').map(Number));
  const bx = rows.map((r) => r[0]!);
  const by = rows.map((r) => r[1]!);

  it('BoxBOD from NIST start 1: not converged, suspect the start values, last iterate offered', () => {
    const r = fitModel({
      model: 'expression',
      expr: 'b1*(1-exp(-b2*x))',
      x: { x: bx },
      xNames: ['x'],
      y: by,
      params: { b1: 1, b2: 1 },
    });
    expect(r.converged).toBe(false);
    expect(r.advice?.suspect).toBe('start');
    expect(r.advice?.reason).toMatch(/b2/);
    expect(Object.keys(r.advice!.lastIterate).sort()).toEqual(['b1', 'b2']);
    expect(r.advice!.lastIterate.b1).toBe(byName(r, 'b1').value);
    expect(r.message).toMatch(/suspect the start values/);
  });

  it('BoxBOD from NIST start 2 converges and gives no advice', () => {
    const r = fitModel({
      model: 'expression',
      expr: 'b1*(1-exp(-b2*x))',
      x: { x: bx },
      xNames: ['x'],
      y: by,
      params: { b1: 100, b2: 0.75 },
    });
    expect(r.converged).toBe(true);
    expect(r.advice).toBeUndefined();
  });

  it('parameters that act only as a product cannot be told apart by any data: suspect the data', () => {
    const r = fitModel({
      model: 'expression',
      expr: 'a + b*c*x',
      x: { x },
      xNames: ['x'],
      y,
      params: { a: 1, b: 1, c: 2 },
    });
    expect(r.converged).toBe(false);
    expect(r.advice?.suspect).toBe('data');
  });
});
