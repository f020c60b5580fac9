import { describe, expect, it } from 'vitest';
import { fitModel } from './fit-model.js';

/** Seeded PRNG (mulberry32, common practice) and Box–Muller normal deviates, so noise is reproducible. */
function normalSource(seed: number): () => number {
  let a = seed >>> 0;
  const uniform = (): number => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return () => {
    const u1 = 1 - uniform(); // (0, 1]
    const u2 = uniform();
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
  };
}

/** n/n0 = [1 + ((γ−1)/γ)·φ/Te]^(1/(γ−1)), exp(φ/Te) at γ = 1 (polytropic electron balance, SPEC §3.2). */
function polytropic(phi: number, gamma: number, te: number): number {
  if (gamma === 1) return Math.exp(phi / te);
  const base = 1 + ((gamma - 1) / gamma) * (phi / te);
  return base <= 0 ? 0 : base ** (1 / (gamma - 1));
}

function byName(result: ReturnType<typeof fitModel>, name: string) {
  const p = result.parameters.find((q) => q.name === name);
  if (!p) throw new Error(`no parameter ${name}`);
  return p;
}

describe('power-law recovery', () => {
  // Ion diamagnetic drift v_Di = −γ_i·Ti/(Z·B·Ln) (SPEC §3.1; the textbook fluid drift, e.g. Chen,
  // Introduction to Plasma Physics, §3.5 — from memory). |v_Di| ∝ Ti¹·B⁻¹·Ln⁻¹ exactly.
  const Ti: number[] = [];
  const B: number[] = [];
  const Ln: number[] = [];
  const v: number[] = [];
  const gammaI = 5 / 3;
  const Z = 1;
  for (const ti of [0.5, 1, 2, 5, 10, 20])
    for (const b of [0.02, 0.05, 0.1, 0.2, 0.5])
      for (const ln of [0.005, 0.01, 0.03, 0.1]) {
        Ti.push(ti);
        B.push(b);
        Ln.push(ln);
        v.push(Math.abs((-gammaI * ti) / (Z * b * ln)));
      }

  it('gets exponents 1, −1, −1 to 1e-9 on noiseless drift data, and withholds standard errors that would only measure rounding', () => {
    const result = fitModel({
      model: 'power-law',
      x: { Ti_eV: Ti, B_T: B, Ln_m: Ln },
      xNames: ['Ti_eV', 'B_T', 'Ln_m'],
      y: v,
    });
    expect(result.converged).toBe(true);
    expect(result.parameters.map((p) => p.name)).toEqual(['C', 'exp_Ti_eV', 'exp_B_T', 'exp_Ln_m']);
    expect(Math.abs(byName(result, 'exp_Ti_eV').value - 1)).toBeLessThan(1e-9);
    expect(Math.abs(byName(result, 'exp_B_T').value + 1)).toBeLessThan(1e-9);
    expect(Math.abs(byName(result, 'exp_Ln_m').value + 1)).toBeLessThan(1e-9);
    expect(Math.abs(byName(result, 'C').value / (gammaI / Z) - 1)).toBeLessThan(1e-9);
    // Exact data: s² measures floating-point rounding, so no standard error is claimed (and the message says so).
    for (const p of result.parameters) expect(p.stdError).toBeNaN();
    expect(result.message).toMatch(/rounding level/);
    expect(result.r2).toBeCloseTo(1, 12);
    expect(result.n).toBe(120);
    expect(result.dof).toBe(116);
  });

  it('recovers the exponents from start values far from the log-linear guess', () => {
    const result = fitModel({
      model: 'power-law',
      x: { Ti_eV: Ti, B_T: B, Ln_m: Ln },
      xNames: ['Ti_eV', 'B_T', 'Ln_m'],
      y: v,
      params: { C: 3, exp_Ti_eV: 0.7, exp_B_T: -0.6, exp_Ln_m: -1.3 },
    });
    expect(result.converged).toBe(true);
    expect(Math.abs(byName(result, 'exp_Ti_eV').value - 1)).toBeLessThan(1e-9);
    expect(Math.abs(byName(result, 'exp_Ln_m').value + 1)).toBeLessThan(1e-9);
  });
});

describe('large data (library stage on a subsample, refinement on all points)', () => {
  it('recovers a three-exponent power law over 20,000 points from a poor start', () => {
    const n = 20_000;
    const noise = normalSource(99);
    const T = new Float64Array(n);
    const Bv = new Float64Array(n);
    const L = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      T[i] = 1 + (49 * Math.abs(noise())) / 3;
      Bv[i] = 0.05 + Math.abs(noise()) / 4;
      L[i] = 0.01 + Math.abs(noise()) / 20;
      y[i] = T[i]! ** 1 * Bv[i]! ** -1 * L[i]! ** -1;
    }
    const result = fitModel({
      model: 'power-law',
      x: { T, B: Bv, L },
      xNames: ['T', 'B', 'L'],
      y,
      params: { C: 0.3, exp_T: 0.5, exp_B: -0.5, exp_L: -0.5 },
    });
    expect(result.converged).toBe(true);
    expect(Math.abs(byName(result, 'exp_T').value - 1)).toBeLessThan(1e-9);
    expect(Math.abs(byName(result, 'exp_B').value + 1)).toBeLessThan(1e-9);
    expect(Math.abs(byName(result, 'exp_L').value + 1)).toBeLessThan(1e-9);
    expect(Math.abs(byName(result, 'C').value - 1)).toBeLessThan(1e-9);
  });
});

describe('exponential (Boltzmann form) recovery', () => {
  it('recovers A and s = Te from n = n0·exp(φ/Te) (Boltzmann relation, common practice)', () => {
    const phi = Array.from({ length: 30 }, (_, i) => -15 + i * 0.6);
    const y = phi.map((p) => 2.5e17 * Math.exp(p / 4.2));
    const result = fitModel({ model: 'exponential', x: { phi_V: phi }, xNames: ['phi_V'], y });
    expect(result.converged).toBe(true);
    expect(byName(result, 's').value).toBeCloseTo(4.2, 10);
    expect(byName(result, 'A').value / 2.5e17).toBeCloseTo(1, 10);
  });
});

describe('polytropic recovery', () => {
  const phi = Array.from({ length: 80 }, (_, i) => -14 + (i * 16) / 79); // V, above the −17.5 V cutoff
  const sigmaAbs = 0.01;

  it('fits γ = 1.4, Te = 5 eV within 3 standard errors from seeded Gaussian noise', () => {
    const noise = normalSource(20240611);
    const y = phi.map((p) => polytropic(p, 1.4, 5) + sigmaAbs * noise());
    const result = fitModel({
      model: 'polytropic',
      x: { phi_V: phi },
      xNames: ['phi_V'],
      y,
      sigma: phi.map(() => sigmaAbs),
    });
    expect(result.converged).toBe(true);
    const gamma = byName(result, 'gamma');
    const te = byName(result, 'Te_eV');
    // Truth is the generating γ and Te; a correct fit lies within ~3σ of it.
    expect(Math.abs(gamma.value - 1.4)).toBeLessThan(3 * gamma.stdError);
    expect(Math.abs(te.value - 5)).toBeLessThan(3 * te.stdError);
    expect(gamma.stdError).toBeGreaterThan(0);
    expect(gamma.stdError).toBeLessThan(0.05);
    // With the true σ as weights, the reduced χ² is ≈ 1 (χ² with 78 dof: 1 ± 0.16 at 1σ).
    expect(result.chi2red).toBeGreaterThan(0.6);
    expect(result.chi2red).toBeLessThan(1.5);
  });

  it('recovers γ ≈ 1 from Boltzmann data (γ = 1 exactly), with and without noise', () => {
    const clean = phi.map((p) => polytropic(p, 1, 5));
    const exact = fitModel({
      model: 'polytropic',
      x: { phi_V: phi },
      xNames: ['phi_V'],
      y: clean,
      params: { gamma: 1.3 },
    });
    expect(exact.converged).toBe(true);
    expect(Math.abs(byName(exact, 'gamma').value - 1)).toBeLessThan(1e-8);
    expect(Math.abs(byName(exact, 'Te_eV').value - 5)).toBeLessThan(1e-7);

    const noise = normalSource(7);
    const noisy = clean.map((c) => c + sigmaAbs * noise());
    const result = fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y: noisy });
    expect(result.converged).toBe(true);
    const gamma = byName(result, 'gamma');
    expect(Math.abs(gamma.value - 1)).toBeLessThan(3 * gamma.stdError);
    expect(Math.abs(byName(result, 'Te_eV').value - 5)).toBeLessThan(3 * byName(result, 'Te_eV').stdError);
  });

  it('is smooth through γ = 1: noiseless data at γ = 1 + 1e-7 and 1 − 1e-7 give back γ', () => {
    for (const g of [1 + 1e-7, 1 - 1e-7, 1.05]) {
      const y = phi.map((p) => polytropic(p, g, 3));
      const result = fitModel({ model: 'polytropic', x: { phi_V: phi }, xNames: ['phi_V'], y });
      expect(result.converged).toBe(true);
      expect(Math.abs(byName(result, 'gamma').value - g)).toBeLessThan(1e-8);
      // Noiseless data: where the residuals are at the rounding level the standard errors are withheld and
      // the message says so; otherwise they are finite.
      const se = byName(result, 'gamma').stdError;
      if (/rounding level/.test(result.message)) expect(se).toBeNaN();
      else expect(Number.isFinite(se)).toBe(true);
    }
  });

  it('gives zero density past the cutoff φ < −γTe/(γ−1) and still fits (SPEC §3.2)', () => {
    const wide = Array.from({ length: 60 }, (_, i) => -25 + i * 0.45); // cutoff at −17.5 V for γ = 1.4, Te = 5
    const y = wide.map((p) => polytropic(p, 1.4, 5));
    expect(y[0]).toBe(0);
    const result = fitModel({
      model: 'polytropic',
      x: { phi_V: wide },
      xNames: ['phi_V'],
      y,
      params: { gamma: 1.2, Te_eV: 4 },
    });
    expect(result.converged).toBe(true);
    expect(byName(result, 'gamma').value).toBeCloseTo(1.4, 8);
    expect(byName(result, 'Te_eV').value).toBeCloseTo(5, 8);
    expect(result.fitted[0]).toBe(0);
  });
});

describe('weighted least squares', () => {
  it('matches the closed-form weighted straight-line fit (Bevington & Robinson, ch. 6 — from memory)', () => {
    const x = [1, 2, 3, 4, 5, 6, 7, 8];
    const y = [2.1, 3.9, 6.2, 7.8, 10.1, 12.2, 13.8, 16.1];
    const s = [0.1, 0.2, 0.1, 0.3, 0.2, 0.1, 0.2, 0.3];
    let S = 0,
      Sx = 0,
      Sy = 0,
      Sxx = 0,
      Sxy = 0;
    x.forEach((xi, i) => {
      const w = 1 / s[i]! ** 2;
      S += w;
      Sx += w * xi;
      Sy += w * y[i]!;
      Sxx += w * xi * xi;
      Sxy += w * xi * y[i]!;
    });
    const D = S * Sxx - Sx * Sx;
    const a = (Sxx * Sy - Sx * Sxy) / D;
    const b = (S * Sxy - Sx * Sy) / D;
    let chi2 = 0;
    x.forEach((xi, i) => (chi2 += ((y[i]! - a - b * xi) / s[i]!) ** 2));
    const chi2red = chi2 / (x.length - 2);
    const result = fitModel({
      model: 'expression',
      expr: 'a + b*x',
      x: { x },
      xNames: ['x'],
      y,
      sigma: s,
      params: { a: 0, b: 1 },
    });
    expect(result.converged).toBe(true);
    expect(byName(result, 'a').value).toBeCloseTo(a, 10);
    expect(byName(result, 'b').value).toBeCloseTo(b, 10);
    // Covariance scaled by the reduced χ²: σ_a² = χ²_red·Sxx/D, σ_b² = χ²_red·S/D.
    expect(byName(result, 'a').stdError / Math.sqrt((chi2red * Sxx) / D)).toBeCloseTo(1, 8);
    expect(byName(result, 'b').stdError / Math.sqrt((chi2red * S) / D)).toBeCloseTo(1, 8);
    expect(result.chi2red).toBeCloseTo(chi2red, 10);
  });
});
