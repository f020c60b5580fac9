import { jStat } from 'jstat';
import { describe, expect, it } from 'vitest';
import { tQuantile, tTwoSidedTail } from './t-quantile.js';

describe('Student-t quantile', () => {
  // Reference library: jStat 1.9.6 (npm registry), jStat.studentt.inv — an independent implementation
  // (inverse incomplete beta by Newton iteration), a devDependency used only here. jStat itself is good
  // to about 2e-8 (at ν = 2, p = 0.9 it is 1.8e-8 off the closed form below), hence 1e-6.
  it('agrees with jStat.studentt.inv to 1e-6 relative over ν = 1…1000 and p = 0.9…0.9995', () => {
    for (const dof of [1, 2, 3, 4, 5, 7, 10, 15, 20, 30, 60, 100, 250, 1000]) {
      for (const p of [0.9, 0.95, 0.975, 0.99, 0.995, 0.9995]) {
        const ref = jStat.studentt.inv(p, dof);
        expect(Math.abs(tQuantile(p, dof) - ref) / ref, `ν = ${dof}, p = ${p}`).toBeLessThan(1e-6);
      }
    }
  });
  // Printed table: NIST/SEMATECH e-Handbook of Statistical Methods §1.3.6.7.2, "Critical values of
  // the Student's t distribution", column 0.975 (upper-tail 0.025), printed to 3 decimals. The same
  // values are in every printed t-table (e.g. Abramowitz & Stegun Table 26.10); confirmed here against
  // jStat above rather than from memory.
  it('matches the printed t-table at 3 decimals', () => {
    const table: [number, number][] = [
      [1, 12.706],
      [2, 4.303],
      [5, 2.571],
      [10, 2.228],
      [30, 2.042],
      [100, 1.984],
    ];
    for (const [dof, t] of table) expect(tQuantile(0.975, dof)).toBeCloseTo(t, 3);
  });
  it('agrees with closed forms for ν = 1 and ν = 2 to 1e-12', () => {
    // ν = 1 is the Cauchy distribution: t = tan(π(p − 1/2)).
    expect(tQuantile(0.975, 1)).toBeCloseTo(Math.tan(Math.PI * 0.475), 10);
    // ν = 2: t = (2p − 1)·sqrt(2 / (4p(1 − p))).
    const p = 0.975;
    expect(tQuantile(p, 2)).toBeCloseTo((2 * p - 1) * Math.sqrt(2 / (4 * p * (1 - p))), 12);
  });
  // Normal quantile z(0.975) = 1.959964 (common practice).
  it('tends to the normal quantile for large ν', () => {
    expect(tQuantile(0.975, 1e7)).toBeCloseTo(1.959964, 5);
  });
  it('inverts the tail, which matches jStat.studentt.cdf', () => {
    for (const dof of [3, 17, 250]) {
      expect(tTwoSidedTail(tQuantile(0.975, dof), dof)).toBeCloseTo(0.05, 12);
      expect(tTwoSidedTail(2.5, dof)).toBeCloseTo(2 * (1 - jStat.studentt.cdf(2.5, dof)), 8);
    }
  });
  it('is NaN where undefined', () => {
    expect(tQuantile(0.975, 0)).toBeNaN();
    expect(tQuantile(0.3, 5)).toBeNaN();
  });
});
