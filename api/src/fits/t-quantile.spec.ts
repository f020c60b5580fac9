import { describe, expect, it } from 'vitest';
import { tQuantile, tTwoSidedTail } from './t-quantile.js';

describe('Student-t quantile', () => {
  // Critical values t(0.975, ν) from the table of the NIST/SEMATECH e-Handbook of Statistical
  // Methods §1.3.6.7.2 (printed to 3 decimals; values recalled from memory of that table).
  it('matches the e-Handbook table at 3 decimals', () => {
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
  it('inverts the tail', () => {
    for (const dof of [3, 17, 250]) expect(tTwoSidedTail(tQuantile(0.975, dof), dof)).toBeCloseTo(0.05, 12);
  });
  it('is NaN where undefined', () => {
    expect(tQuantile(0.975, 0)).toBeNaN();
    expect(tQuantile(0.3, 5)).toBeNaN();
  });
});
