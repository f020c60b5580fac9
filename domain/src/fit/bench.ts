import { fitModel } from './fit-model.js';

/**
 * Times one power-law fit with three exponents (|v_Di| ∝ Ti/(B·Ln) with 1 % multiplicative
 * noise from a fixed linear congruential sequence) for a bench runner to print; not a test.
 */
export function benchPowerLawFit(n = 100_000): { n: number; ms: number; converged: boolean; iterations: number } {
  let state = 12345;
  const uniform = (): number => (state = (state * 1103515245 + 12345) % 2147483648) / 2147483648;
  const Ti = new Float64Array(n);
  const B = new Float64Array(n);
  const Ln = new Float64Array(n);
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    Ti[i] = 0.5 + 50 * uniform();
    B[i] = 0.02 + uniform();
    Ln[i] = 0.005 + 0.1 * uniform();
    v[i] = (((5 / 3) * Ti[i]!) / (B[i]! * Ln[i]!)) * (1 + 0.01 * (uniform() - 0.5));
  }
  const t0 = performance.now();
  const result = fitModel({
    model: 'power-law',
    x: { Ti_eV: Ti, B_T: B, Ln_m: Ln },
    xNames: ['Ti_eV', 'B_T', 'Ln_m'],
    y: v,
  });
  return { n, ms: performance.now() - t0, converged: result.converged, iterations: result.iterations };
}
