/**
 * Sweep definitions the bench submits: an argon-column cross-field grid (Te × B × Ln) sized to a
 * point count, parallel-balance and column-profile grids for the compiled evaluator, and a
 * 3-input grid for the fit through the api.
 */
import { smallSweep } from '../../support/sweeps.js';

/** B has 10 values and Te 200 (or 100): a 2,000-point line series (x = Te, groupBy = B) exists. */
export function crossFieldGrid(points: number) {
  const teCount = points % 2000 === 0 ? 200 : 100;
  const lnCount = points / (teCount * 10);
  if (!Number.isInteger(lnCount) || lnCount < 1)
    throw new Error(`bench grid: ${points} points is not a multiple of ${teCount * 10}`);
  const axes: unknown[] = [
    { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: teCount },
    { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 10 },
  ];
  const fixed: Record<string, unknown> = {
    n_m3: 1e18,
    mu: 40,
    Z: 1,
    Er_Vm: 0,
    gamma_i: 1,
    gamma_e: 1,
    Ti_eV: 'Te_eV',
    Ln_m: 0.02,
  };
  if (lnCount > 1) {
    axes.push({ param: 'Ln_m', kind: 'linear', min: 0.005, max: 0.1, count: lnCount });
    delete fixed.Ln_m;
  }
  return smallSweep({ name: `Bench argon column grid, ${points} points`, fixed, axes, tags: ['bench'] });
}

/** A Te × φ × γ cube of about `points` (side rounded). */
export function parallelBalanceGrid(points: number) {
  const side = Math.max(2, Math.round(Math.cbrt(points)));
  return {
    name: `Bench presheath grid, ${points} points`,
    model: 'parallel-balance',
    fixed: { n0_m3: 1e18, Lpar_m: 0.5, mu: 40 },
    axes: [
      { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: side },
      { param: 'phi_V', kind: 'linear', min: -50, max: 0, count: side },
      { param: 'gamma_e', kind: 'linear', min: 1, max: 3, count: side },
    ],
    sampling: { kind: 'grid' },
  };
}

export function columnProfileGrid(points: number) {
  const bCount = 10;
  const aCount = points / bCount;
  if (!Number.isInteger(aCount)) throw new Error(`bench grid: ${points} is not a multiple of ${bCount}`);
  return {
    name: `Bench column width grid, ${points} points`,
    model: 'column-profile',
    fixed: {
      n0_m3: 1e18,
      Te0_eV: 4,
      Ti0_eV: 0.05,
      mu: 40,
      Z: 1,
      phi0_V: 10,
      gamma_e: 1,
      gamma_i: 1,
      nr: 256,
      rmax_over_a: 3,
    },
    axes: [
      { param: 'a_m', kind: 'linear', min: 0.01, max: 0.05, count: aCount },
      { param: 'B0_T', kind: 'linear', min: 0.05, max: 0.5, count: bCount },
    ],
    sampling: { kind: 'grid' },
  };
}

/** A Te × B × Ln grid near `points` (cube side rounded) for a power-law fit of vDe ∝ Te/(B·Ln). */
export function fitGrid(points: number) {
  const side = Math.max(2, Math.round(Math.cbrt(points)));
  return smallSweep({
    name: `Bench fit source, ${side ** 3} points`,
    fixed: { n_m3: 1e18, mu: 40, Z: 1, Er_Vm: 0, gamma_i: 1, gamma_e: 1, Ti_eV: 'Te_eV' },
    axes: [
      { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: side },
      { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: side },
      { param: 'Ln_m', kind: 'linear', min: 0.005, max: 0.1, count: side },
    ],
    tags: ['bench'],
  });
}
