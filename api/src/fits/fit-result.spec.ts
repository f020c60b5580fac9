import { describe, expect, it } from 'vitest';
import { fitModel, type FitRequest } from '@driftgrid/domain';
import { PLOT_MAX_POINTS, buildStoredResult, engineInput } from './fit-result.js';
import type { FitData } from './fit-sources.js';

function data(cols: Record<string, number[]>, units: Record<string, string> = {}): FitData {
  const d: Record<string, Float64Array> = {};
  for (const [k, v] of Object.entries(cols)) d[k] = Float64Array.from(v);
  const n = Object.values(d)[0]!.length;
  return {
    source: { kind: 'dataset', id: 1, name: 'test', modelVersion: null },
    columns: Object.keys(cols).map((name) => ({ name, unit: units[name] ?? '', kind: 'measured' })),
    n,
    dropped: 0,
    data: d,
  };
}

const req = (over: Partial<FitRequest>): FitRequest =>
  ({ source: { kind: 'dataset', id: '1' }, model: 'power-law', y: 'y', x: ['a'], ...over }) as FitRequest;

describe('stored fit result', () => {
  it('fits |y| for an all-negative power law and restores the sign on C, fitted values, residuals and covariance', () => {
    const a = Array.from({ length: 30 }, (_, i) => 1 + i);
    const b = Array.from({ length: 30 }, (_, i) => 2 + ((i * 7) % 11));
    // y = −2.5·a^0.5·b^−1 with a small deterministic wiggle, so the covariance is not zero.
    const y = a.map((v, i) => ((-2.5 * Math.sqrt(v)) / b[i]!) * (1 + 1e-3 * Math.sin(i)));
    const r = req({ x: ['a', 'b'] });
    const d = data({ y, a, b });
    const { input, flipped } = engineInput(r, d);
    expect(flipped).toBe(true);
    const raw = fitModel(input);
    const s = buildStoredResult(r, d, raw, flipped);
    expect(s.signRestored).toBe(true);
    expect(s.parameters[0]!.value).toBeCloseTo(-raw.parameters[0]!.value, 15);
    expect(s.parameters[0]!.value!).toBeLessThan(0);
    expect(s.parameters[1]!.value).toBeCloseTo(0.5, 2);
    expect(s.parameters[2]!.value).toBeCloseTo(-1, 2);
    // Observed − fitted in the original sign: fitted ≈ y, residual = y − fitted.
    for (let i = 0; i < 30; i++) expect(s.plot.y[i]! - s.plot.fitted[i]!).toBeCloseTo(s.plot.residuals[i]!, 12);
    // cov(−C, a) = −cov(C, a); variances unchanged.
    expect(s.covariance[0]![1]).toBeCloseTo(-raw.covariance[0]![1]!, 20);
    expect(s.covariance[0]![0]).toBe(raw.covariance[0]![0]);
    expect(s.covariance[1]![2]).toBe(raw.covariance[1]![2]);
  });

  it('gives 95 % intervals value ± t(0.975, dof)·stdError and units where plain', () => {
    // Polytropic relation, SPEC §3.2, γ = 1.4, Te = 5 eV, a small deterministic perturbation.
    const phi = Array.from({ length: 12 }, (_, i) => -10 + i);
    const y = phi.map((p, i) => (1 + (0.4 / 1.4) * (p / 5)) ** (1 / 0.4) * (1 + 0.01 * Math.cos(3 * i)));
    const r = req({ model: 'polytropic', y: 'n', x: 'phi', normalised: true });
    const d = data({ n: y, phi }, { phi: 'V' });
    const { input } = engineInput(r, d);
    const s = buildStoredResult(r, d, fitModel(input), false);
    expect(s.dof).toBe(10);
    // t(0.975, 10) = 2.228 (NIST/SEMATECH e-Handbook §1.3.6.7.2 table).
    expect(s.confidence.t!).toBeCloseTo(2.228, 3);
    for (const p of s.parameters) {
      expect(p.ci95!.high - p.value!).toBeCloseTo(s.confidence.t! * p.stdError!, 12);
      expect(p.value! - p.ci95!.low).toBeCloseTo(s.confidence.t! * p.stdError!, 12);
    }
    expect(s.parameters.map((p) => p.unit)).toEqual(['1', 'eV']);
  });

  it('gives the polytropic scale n0 the unit of y when the data are raw densities', () => {
    // Polytropic relation, SPEC §3.2, γ = 1.4, Te = 5 eV, n0 = 1e18 m^-3, a small deterministic perturbation.
    const phi = Array.from({ length: 12 }, (_, i) => -10 + i);
    const y = phi.map((p, i) => 1e18 * (1 + (0.4 / 1.4) * (p / 5)) ** (1 / 0.4) * (1 + 0.01 * Math.cos(3 * i)));
    const r = req({ model: 'polytropic', y: 'n', x: 'phi' });
    const d = data({ n: y, phi }, { phi: 'V', n: 'm^-3' });
    const s = buildStoredResult(r, d, fitModel(engineInput(r, d).input), false);
    expect(s.parameters.map((p) => [p.name, p.unit])).toEqual([
      ['gamma', '1'],
      ['Te_eV', 'eV'],
      ['n0', 'm^-3'],
    ]);
    expect(s.parameters[2]!.value! / 1e18).toBeCloseTo(1, 1);
  });

  it('down-samples the plot to at most 2,000 points with matching x', () => {
    const n = 4999;
    const x = Array.from({ length: n }, (_, i) => 1 + i);
    const y = x.map((v) => 3 * Math.exp(v / 2000));
    const r = req({ model: 'exponential', x: 'x' });
    const d = data({ y, x }, { x: 'V', y: 'm^-3' });
    const s = buildStoredResult(r, d, fitModel(engineInput(r, d).input), false);
    expect(s.plot.shown).toBeLessThanOrEqual(PLOT_MAX_POINTS);
    expect(s.plot.total).toBe(n);
    expect(s.plot.x.x).toHaveLength(s.plot.shown);
    const stride = Math.ceil(n / PLOT_MAX_POINTS);
    expect(s.plot.x.x![5]).toBe(x[5 * stride]);
    expect(s.plot.y[5]).toBe(y[5 * stride]);
    // x a potential in V: the scale s (= Te/e) in V reads as Te in eV (Boltzmann relation, Chen §3.5).
    expect(s.parameters.map((p) => p.unit)).toEqual(['m^-3', 'eV']);
  });

  it("gives the power-law prefactor C the unit [y]·[x]^(−a) with the fitted exponent, and the scale s x's unit", () => {
    // y = 2·B^-1.5 (dimensional homogeneity: [C] = [y]/[B]^a, common practice).
    const B = [0.5, 1, 1.5, 2, 2.5, 3];
    const y = B.map((b) => 2 * b ** -1.5);
    const r = req({ model: 'power-law', y: 'y', x: 'B' });
    const d = data({ y, B }, { y: 'm/s', B: 'T' });
    const s = buildStoredResult(r, d, fitModel(engineInput(r, d).input), false);
    expect(s.parameters.map((p) => [p.name, p.unit])).toEqual([
      ['C', 'm/s * T^1.5'],
      ['exp_B', '1'],
    ]);
    const e = req({ model: 'exponential', y: 'y', x: 'z' });
    const z = [0, 1, 2, 3, 4];
    const de = data({ y: z.map((v) => 3 * Math.exp(-v / 2)), z }, { y: 'm^-3', z: 'm' });
    const se = buildStoredResult(e, de, fitModel(engineInput(e, de).input), false);
    expect(se.parameters.map((p) => p.unit)).toEqual(['m^-3', 'm']);
  });

  it('leaves a power law of mixed sign to the engine, which refuses it naming y', () => {
    const r = req({});
    const d = data({ y: [1, -2, 3, 4], a: [1, 2, 3, 4] });
    const { input, flipped } = engineInput(r, d);
    expect(flipped).toBe(false);
    expect(() => fitModel(input)).toThrow(/y > 0/);
  });
});
