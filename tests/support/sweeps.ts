import { isActiveState } from '@driftgrid/domain';
import type { TestApp } from './app.js';

/** A small cross-field grid in our demo scenario (argon column, Te × B). */
export function smallSweep(overrides: Record<string, unknown> = {}) {
  return {
    name: 'Argon column test scan',
    model: 'cross-field',
    fixed: { n_m3: 1e18, mu: 40, Z: 1, Er_Vm: 0, gamma_i: 1, gamma_e: 1, Ti_eV: 'Te_eV', Ln_m: 0.02 },
    axes: [
      { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 7 },
      { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 5 },
    ],
    sampling: { kind: 'grid' },
    tags: ['argon', 'test'],
    ...overrides,
  };
}

/**
 * Derived columns whose every value is not finite, by IEEE 754 (x/0 is ±∞ by the sign of x, 0/0 is NaN),
 * plus `finite` as a control: the three texts results and exports use for them.
 */
export const NON_FINITE_DERIVED = [
  { name: 'up', expr: 'Te_eV / 0' },
  { name: 'down', expr: '-Te_eV / 0' },
  { name: 'undef', expr: '(Te_eV - Te_eV) / 0' },
  { name: 'finite', expr: 'Te_eV * 2' },
];

/** Polls until the sweep leaves queued/running (or the deadline passes). */
export async function waitForSweep(t: TestApp, token: string, id: number, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await t.http.get(`/api/sweeps/${id}`).set('authorization', `Bearer ${token}`);
    if (res.status !== 200) throw new Error(`GET sweep ${id}: ${res.status} ${JSON.stringify(res.body)}`);
    if (!isActiveState(res.body.status)) return res.body;
    if (Date.now() > deadline)
      throw new Error(`sweep ${id} still ${res.body.status} (${res.body.progress.done}/${res.body.progress.total})`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
