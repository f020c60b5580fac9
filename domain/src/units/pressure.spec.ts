/** Neutral pressure as an input: n = p/(k_B T) (ideal gas, common practice). */
import { describe, expect, it } from 'vitest';
import { ValidationError } from '../errors.js';
import { crossField } from '../models/cross-field.js';
import { resolveInputs } from '../models/validate.js';
import { compileSweep } from '../sweep/compile.js';
import { densityFromPressure, pressureInPascal } from './pressure.js';

describe('neutral pressure → density', () => {
  it('reproduces the Loschmidt constant (CODATA 2018: 2.686780111e25 m⁻³ at 273.15 K, 101.325 kPa)', () => {
    const n = densityFromPressure(pressureInPascal('101.325 kPa')!, 273.15 / 11604.518121550082);
    expect(Math.abs(n / 2.686780111e25 - 1)).toBeLessThan(1e-9);
  });

  it('reads pressure units and nothing else', () => {
    expect(pressureInPascal('1 Pa')).toBe(1);
    // 1 Torr = 101325/760 Pa by definition (BIPM SI brochure, non-SI units; common practice).
    expect(pressureInPascal('1 torr')).toBeCloseTo(133.322368, 5);
    expect(pressureInPascal('7.5 mtorr')).toBeCloseTo(0.99991776, 7);
    expect(pressureInPascal('2 mbar')).toBeCloseTo(200, 9);
    expect(pressureInPascal('1e19 m^-3')).toBeNull();
    expect(pressureInPascal('3')).toBeNull();
  });

  it('single point: nn_m3 = "1 Pa" converts at T_n (given or the room-temperature default)', () => {
    const at300 = resolveInputs(crossField, { nn_m3: '1 Pa', Tn_eV: '300 K' });
    // 1 Pa / (k_B · 300 K) = 2.41432e20 m⁻³ (k_B = 1.380649e-23 J/K exact).
    expect(at300.nn_m3! / (1 / (1.380649e-23 * 300)) - 1).toBeLessThan(1e-12);
    // The default T_n is 300 K to 5 significant figures, 0.025852 eV.
    const byDefault = resolveInputs(crossField, { nn_m3: '1 Pa' });
    expect(byDefault.nn_m3! / (1 / (1.602176634e-19 * 0.025852))).toBeCloseTo(1, 12);
    expect(byDefault.nn_m3! / at300.nn_m3!).toBeCloseTo(1, 5);
    expect(() => resolveInputs(crossField, { nn_m3: '1e9 Pa', Tn_eV: 1e-6 })).toThrow(ValidationError);
  });

  it('sweeps: a pressure axis and a fixed pressure convert at the fixed T_n; a swept T_n is refused', () => {
    const s = compileSweep({
      name: 'p',
      model: 'cross-field',
      fixed: { Tn_eV: '300 K' },
      axes: [{ param: 'nn_m3', kind: 'log', min: '0.1 Pa', max: '10 Pa', count: 3 }],
      sampling: { kind: 'grid' },
    });
    const n1 = 1 / (1.380649e-23 * 300);
    expect(s.pointAt(1).nn_m3! / n1).toBeCloseTo(1, 12);
    expect(s.pointAt(2).nn_m3! / (10 * n1)).toBeCloseTo(1, 12);
    const f = compileSweep({
      name: 'p',
      model: 'cross-field',
      fixed: { nn_m3: '1 Pa' },
      axes: [{ param: 'B_T', kind: 'linear', min: 0.1, max: 0.2, count: 2 }],
      sampling: { kind: 'grid' },
    });
    expect(f.pointAt(0).nn_m3! / (1 / (1.602176634e-19 * 0.025852))).toBeCloseTo(1, 12);
    expect(() =>
      compileSweep({
        name: 'p',
        model: 'cross-field',
        fixed: { nn_m3: '1 Pa' },
        axes: [{ param: 'Tn_eV', kind: 'linear', min: 0.02, max: 0.05, count: 2 }],
        sampling: { kind: 'grid' },
      }),
    ).toThrow(/fixed Tn_eV/);
  });
});
