import { describe, expect, it } from 'vitest';
import { saltelliCoordinate, saltelliPointCount } from '../sweep/sampling/saltelli.js';
import { saltelliOutputs } from './saltelli-outputs.js';
import { estimateSobolIndices, type SobolEstimate } from './sobol-indices.js';

/** Run f over every point of a Saltelli design on [lo, hi]^d and estimate the indices. */
function analyse(f: (x: Float64Array) => number, d: number, samples: number, lo: number, hi: number): SobolEstimate {
  const values = new Float64Array(saltelliPointCount(samples, d));
  const x = new Float64Array(d);
  for (let p = 0; p < values.length; p++) {
    for (let i = 0; i < d; i++) x[i] = lo + (hi - lo) * saltelliCoordinate(p, i, d);
    values[p] = f(x);
  }
  return estimateSobolIndices(saltelliOutputs(values, d, samples));
}

function expectInside(value: number, ci: [number, number] | null, label: string): void {
  expect(ci, label).not.toBeNull();
  expect(value, `${label}: ${value} in [${ci![0]}, ${ci![1]}]`).toBeGreaterThanOrEqual(ci![0]);
  expect(value, `${label}: ${value} in [${ci![0]}, ${ci![1]}]`).toBeLessThanOrEqual(ci![1]);
}

describe('Sobol indices (Saltelli et al. 2010 first order, Jansen 1999 total) — Ishigami function', () => {
  // Ishigami & Homma 1990 (Proc. ISUMA '90, 398–403): f = sin x1 + a sin² x2 + b x3⁴ sin x1, x_i ~ U(−π, π).
  // Its variance decomposition, as published with the function and restated in Saltelli et al.,
  // "Global Sensitivity Analysis: The Primer" (2008) and Sobol' & Levitan (1999) — written here from memory:
  //   V   = a²/8 + b π⁴/5 + b² π⁸/18 + 1/2
  //   V1  = (1 + b π⁴/5)² / 2,  V2 = a²/8,  V3 = 0,  V13 = b² π⁸ (1/18 − 1/50) = 8 b² π⁸/225,
  //   V12 = V23 = V123 = 0;  S_i = V_i/V,  S_T1 = (V1 + V13)/V,  S_T2 = V2/V,  S_T3 = V13/V.
  const a = 7;
  const b = 0.1;
  const pi4 = Math.PI ** 4;
  const pi8 = Math.PI ** 8;
  const V = (a * a) / 8 + (b * pi4) / 5 + (b * b * pi8) / 18 + 0.5;
  const V1 = (1 + (b * pi4) / 5) ** 2 / 2;
  const V2 = (a * a) / 8;
  const V13 = b * b * pi8 * (1 / 18 - 1 / 50);
  const first = [V1 / V, V2 / V, 0];
  const total = [(V1 + V13) / V, V2 / V, V13 / V];
  const ishigami = (x: Float64Array): number =>
    Math.sin(x[0]!) + a * Math.sin(x[1]!) ** 2 + b * x[2]! ** 4 * Math.sin(x[0]!);

  it('derives the commonly quoted analytic values (S1 0.3139, S2 0.4424, S3 0, ST3 0.2437)', () => {
    // The four-digit values quoted with the function in the sensitivity-analysis literature
    // (e.g. Saltelli et al. 2008 / 2010 test sections) — a check of the formulas above, from memory.
    expect(first[0]).toBeCloseTo(0.3139, 4);
    expect(first[1]).toBeCloseTo(0.4424, 4);
    expect(total[0]).toBeCloseTo(0.5576, 4);
    expect(total[2]).toBeCloseTo(0.2437, 4);
    // The decomposition is complete: V1 + V2 + V13 = V.
    expect(V1 + V2 + V13).toBeCloseTo(V, 10);
  });

  it('contains the analytic indices in the 95 % bootstrap intervals at N = 2^14', () => {
    const est = analyse(ishigami, 3, 2 ** 14, -Math.PI, Math.PI);
    expect(est.n).toBe(2 ** 14);
    expect(est.bootstrap).toMatchObject({ resamples: 1000, level: 0.95, units: 2 ** 14 });
    expect(est.variance).toBeCloseTo(V, 0);
    est.indices.forEach((ix, i) => {
      expectInside(first[i]!, ix.firstCI, `S${i + 1}`);
      expectInside(total[i]!, ix.totalCI, `ST${i + 1}`);
      // The intervals are informative, not merely wide, and hold their own point estimate.
      expect(ix.firstCI![1] - ix.firstCI![0], `S${i + 1} width`).toBeLessThan(0.06);
      expect(ix.totalCI![1] - ix.totalCI![0], `ST${i + 1} width`).toBeLessThan(0.06);
      expectInside(ix.first!, ix.firstCI, `S${i + 1} estimate`);
      expectInside(ix.total!, ix.totalCI, `ST${i + 1} estimate`);
      expect(ix.first!).toBeCloseTo(first[i]!, 1);
      expect(ix.total!).toBeCloseTo(total[i]!, 1);
    });
  });

  it('gives the same intervals for the same seed and different ones for another seed', () => {
    const d = 3;
    const samples = 512;
    const values = new Float64Array(saltelliPointCount(samples, d));
    const x = new Float64Array(d);
    for (let p = 0; p < values.length; p++) {
      for (let i = 0; i < d; i++) x[i] = -Math.PI + 2 * Math.PI * saltelliCoordinate(p, i, d);
      values[p] = ishigami(x);
    }
    const o = saltelliOutputs(values, d, samples);
    const one = estimateSobolIndices(o, { seed: 7 });
    expect(estimateSobolIndices(o, { seed: 7 })).toEqual(one);
    const other = estimateSobolIndices(o, { seed: 8 });
    expect(other.indices[0]!.first).toBe(one.indices[0]!.first);
    expect(other.indices[0]!.firstCI).not.toEqual(one.indices[0]!.firstCI);
  });
});

describe("Sobol indices — Sobol G-function (Saltelli & Sobol' 1995)", () => {
  // G(x) = Π_i (|4x_i − 2| + a_i)/(1 + a_i), x_i ~ U(0, 1). Partial variances V_i = 1/(3(1 + a_i)²),
  // V = Π(1 + V_i) − 1, S_i = V_i/V, S_Ti = V_i Π_{k≠i}(1 + V_k)/V (standard results, from memory).
  const coef = [0, 1, 4.5, 9, 99];
  const Vi = coef.map((c) => 1 / (3 * (1 + c) ** 2));
  const V = Vi.reduce((p, v) => p * (1 + v), 1) - 1;
  const first = Vi.map((v) => v / V);
  const total = Vi.map((v, i) => (v * Vi.reduce((p, w, k) => (k === i ? p : p * (1 + w)), 1)) / V);
  const g = (x: Float64Array): number => coef.reduce((p, c, i) => (p * (Math.abs(4 * x[i]! - 2) + c)) / (1 + c), 1);

  it('contains the analytic indices in the intervals at N = 2^12 and ranks the inputs', () => {
    const est = analyse(g, coef.length, 2 ** 12, 0, 1);
    est.indices.forEach((ix, i) => {
      expectInside(first[i]!, ix.firstCI, `S${i + 1}`);
      expectInside(total[i]!, ix.totalCI, `ST${i + 1}`);
    });
    const order = est.indices.map((ix, i) => [ix.total!, i] as const).sort((p, q) => q[0] - p[0]);
    expect(order.map((o) => o[1])).toEqual([0, 1, 2, 3, 4]);
  });
});

describe('Sobol indices — edge cases', () => {
  it('gives exact zeros for an input the output ignores and nulls for a constant output', () => {
    const lin = analyse((x) => 3 * x[0]! + x[2]!, 3, 256, 0, 1);
    // Linear additive output: S_i = S_Ti = c_i² / Σ c² (common practice), and x2 is ignored.
    expect(lin.indices[1]!.total).toBe(0);
    expect(lin.indices[1]!.totalCI).toEqual([0, 0]);
    expect(lin.indices[0]!.total!).toBeCloseTo(0.9, 1);
    const flat = analyse(() => 5, 2, 64, 0, 1);
    expect(flat.variance).toBe(0);
    expect(flat.indices[0]).toEqual({ first: null, firstCI: null, total: null, totalCI: null });
  });

  it('drops incomplete or non-finite groups and resamples blocks above maxUnits', () => {
    const d = 2;
    const samples = 100;
    const values = new Float64Array(saltelliPointCount(samples, d)).map((_, p) => saltelliCoordinate(p, 0, d));
    values[5] = Number.NaN; // group 1
    const o = saltelliOutputs(values.subarray(0, 50 * 4 + 3), d, samples); // groups 50.. missing, 50 partial
    expect(o.n).toBe(49);
    expect(o.dropped).toBe(51);
    const est = estimateSobolIndices(o, { maxUnits: 10, resamples: 200 });
    expect(est.bootstrap.units).toBe(10);
    expect(est.indices[0]!.total!).toBeGreaterThan(0.9);
    expect(() => estimateSobolIndices(saltelliOutputs(values, d, 1))).toThrow(RangeError);
  });
});
