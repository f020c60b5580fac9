import { MantineProvider } from '@mantine/core';
import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { FitResult } from './FitResult.js';
import type { FitView } from './fit-types.js';

function fit(over: Partial<FitView>): FitView {
  return {
    id: 7,
    status: 'completed',
    progress: 1,
    model: 'power-law',
    source: { kind: 'dataset', id: 1, name: 'edge scan' },
    y: 'v_ExB',
    x: ['B_T'],
    request: {} as FitView['request'],
    owner: { id: 1, name: 'Ada' },
    createdAt: '2026-11-30T10:00:00Z',
    appVersion: '1.0.0',
    converged: true,
    r2: 0.999,
    rmse: 12.5,
    residualSd: 13,
    aic: 1,
    bic: 2,
    dof: 10,
    n: 12,
    dropped: 0,
    iterations: 4,
    message: 'converged',
    derived: [],
    confidence: { level: 0.95, method: 't', t: 2.228, dof: 10 },
    // A fit stored before the prefactor had a unit rule: C's unit is null.
    parameters: [
      { name: 'C', value: 1500, stdError: 3, unit: null, ci95: null, fixed: false },
      { name: 'exp_B_T', value: -1, stdError: 0.01, unit: '1', ci95: null, fixed: false },
    ],
    units: { v_ExB: 'm/s', B_T: 'T' },
    ...over,
  } as FitView;
}

const mount = (f: FitView) =>
  render(
    <MantineProvider env="test">
      <FitResult fit={f} />
    </MantineProvider>,
  );

describe('FitResult units', () => {
  it("shows RMSE in y's unit and the power-law prefactor C in [y]·[x]^(−a) (dimensional homogeneity)", () => {
    mount(fit({}));
    expect(screen.getByTestId('fit-rmse').textContent).toContain('RMSE (m/s)');
    // y = C·B^-1 with y in m/s: C in m/s·T (common practice: both sides carry the same unit).
    expect(screen.getByTestId('fit-param-unit-C').textContent).toBe('m/s·T');
    expect(screen.getByTestId('fit-param-unit-exp_B_T').textContent).toBe('dimensionless');
  });

  it('carries a fractional fitted exponent into the unit of C', () => {
    mount(
      fit({
        units: { v_ExB: 'm^-3', B_T: 'T' },
        parameters: [
          { name: 'C', value: 2, stdError: 0.1, unit: null, ci95: null, fixed: false },
          { name: 'exp_B_T', value: 1.5, stdError: 0.01, unit: '1', ci95: null, fixed: false },
        ],
      }),
    );
    expect(screen.getByTestId('fit-param-unit-C').textContent).toBe('m⁻³·T^-1.5');
  });

  it('labels the exponential scale s as Te in eV when x is a potential in V, and in x’s unit otherwise', () => {
    const boltz = fit({
      model: 'exponential',
      y: 'n_e',
      x: 'phi',
      units: { n_e: 'm^-3', phi: 'V' },
      parameters: [
        { name: 'A', value: 1e18, stdError: 1e15, unit: 'm^-3', ci95: null, fixed: false },
        // Stored as V by the older rule: the shown unit follows the help text (Te in eV).
        { name: 's', value: 5, stdError: 0.1, unit: 'V', ci95: null, fixed: false },
      ],
    });
    const { unmount } = mount(boltz);
    const row = screen.getByTestId('fit-param-s');
    expect(within(row).getByText(/Te, electron temperature/)).toBeTruthy();
    expect(screen.getByTestId('fit-param-unit-s').textContent).toBe('eV');
    expect(screen.getByTestId('fit-param-unit-A').textContent).toBe('m⁻³');
    unmount();
    mount({ ...boltz, x: 'z', units: { n_e: 'm^-3', z: 'm' } });
    expect(within(screen.getByTestId('fit-param-s')).getByText(/e-folding scale of x/)).toBeTruthy();
    expect(screen.getByTestId('fit-param-unit-s').textContent).toBe('m');
  });
});
