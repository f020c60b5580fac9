import { describe, expect, it } from 'vitest';
import { compileSweep } from '../sweep/compile.js';
import { saltelliOutputs } from './saltelli-outputs.js';
import { estimateSobolIndices } from './sobol-indices.js';

/**
 * Physics check of the whole path (design → cross-field model → estimators) on an invented argon-column
 * scan. ρ_i/L_n = sqrt(m_i T_i)/(Z e B L_n) (NRL Plasma Formulary, ion gyroradius) depends on T_i, B and
 * L_n but not on T_e, so T_e's total index is zero and the other three are clearly positive.
 */
describe('sensitivity of ρ_i/L_n on a cross-field Saltelli sweep over Te, Ti, B and L_n', () => {
  const ranges = {
    Te_eV: [1, 20],
    Ti_eV: [0.05, 2],
    B_T: [0.05, 0.25],
    Ln_m: [0.01, 0.05],
  } as const;
  const samples = 2 ** 11;
  const compiled = compileSweep({
    name: 'Argon column sensitivity',
    model: 'cross-field',
    fixed: { mu: 40, Z: 1, n_m3: 1e18 },
    axes: Object.entries(ranges).map(([param, [min, max]]) => ({ param, kind: 'log', min, max })),
    sampling: { kind: 'saltelli', samples },
    derived: [{ name: 'log_rho_i_over_Ln', expr: 'log(rho_i_over_Ln)' }],
  });
  const chunk = compiled.evaluateChunk(0, compiled.totalPoints);
  const names = Object.keys(ranges);
  const analyse = (column: string) => estimateSobolIndices(saltelliOutputs(chunk.columns[column]!, 4, samples));

  it('gives Te a total index of zero and Ti, B and L_n clearly positive ones', () => {
    const est = analyse('rho_i_over_Ln');
    expect(est.n).toBe(samples);
    const te = est.indices[0]!;
    // f(A) and f(A_B^Te) are the same numbers when T_e does not enter: Jansen's sum is exactly 0.
    expect(te.total).toBe(0);
    expect(te.totalCI).toEqual([0, 0]);
    expect(Math.abs(te.first!)).toBeLessThan(0.02);
    for (const k of [1, 2, 3]) {
      const ix = est.indices[k]!;
      expect(ix.total!, names[k]).toBeGreaterThan(0.1);
      expect(ix.totalCI![0], names[k]).toBeGreaterThan(0.05);
      expect(ix.first!, names[k]).toBeGreaterThan(0.05);
    }
  });

  it('matches the analytic indices of log(ρ_i/L_n), additive in the log inputs', () => {
    // log(ρ_i/L_n) = ½ log T_i − log B − log L_n + const. Log axes make log x_i uniform, with variance
    // (log(max/min))²/12, and an additive function has S_i = S_Ti = c_i² Var(log x_i) / Σ_k c_k² Var(log x_k)
    // (variance of a sum of independent terms; common practice).
    const c = [0, 0.5, -1, -1];
    const parts = Object.values(ranges).map(([lo, hi], i) => (c[i]! * Math.log(hi / lo)) ** 2 / 12);
    const sum = parts.reduce((p, q) => p + q, 0);
    const est = analyse('log_rho_i_over_Ln');
    est.indices.forEach((ix, i) => {
      const expected = parts[i]! / sum;
      expect(expected).toBeGreaterThanOrEqual(ix.firstCI![0]);
      expect(expected).toBeLessThanOrEqual(ix.firstCI![1]);
      expect(expected).toBeGreaterThanOrEqual(ix.totalCI![0]);
      expect(expected).toBeLessThanOrEqual(ix.totalCI![1]);
    });
    expect(est.indices[0]!.total).toBe(0);
  });
});
