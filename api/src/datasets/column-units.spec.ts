import { describe, expect, it } from 'vitest';
import { ValidationError } from '@driftgrid/domain';
import { columnConversion, toCanonical } from './column-units.js';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('columnConversion', () => {
  it.each([
    // SI prefixes and definitions (exact); 1 G = 1e-4 T (NRL Plasma Formulary cgs–SI table).
    ['cm', 'm', 'length', 3, 0.03],
    ['cm^-3', 'm^-3', 'density', 1e12, 1e18],
    ['G', 'T', 'magnetic field', 1500, 0.15],
    ['kV', 'V', 'potential', -1.5, -1500],
    ['V/cm', 'V/m', 'electric field', 50, 5000],
    ['km/s', 'm/s', 'velocity', 20, 20000],
    ['keV', 'eV', 'temperature', 2, 2000],
    ['us', 's', 'time', 3, 3e-6],
  ] as const)('%s → %s', (unit, canonical, quantity, value, expected) => {
    const c = columnConversion('x', unit);
    expect(c).toMatchObject({ unit, canonicalUnit: canonical, quantity });
    expect(rel(toCanonical(c, value), expected)).toBeLessThan(1e-12);
  });

  it('reads temperatures in kelvin and °C as eV (CODATA 2018: 1 eV ↔ 11604.51812 K)', () => {
    const k = columnConversion('Te', 'K');
    expect(k.canonicalUnit).toBe('eV');
    expect(rel(toCanonical(k, 11604.51812), 1)).toBeLessThan(1e-9);
    const c = columnConversion('Te', 'degC');
    // 0 °C = 273.15 K (SI definition) → 273.15 / 11604.51812 eV.
    expect(rel(toCanonical(c, 0), 273.15 / 11604.51812)).toBeLessThan(1e-9);
    expect(rel(toCanonical(c, 100), 373.15 / 11604.51812)).toBeLessThan(1e-9);
  });

  it('stores energies in joules as eV (CODATA 2018: e = 1.602176634e-19 C, exact)', () => {
    const j = columnConversion('E', 'J');
    expect(j.canonicalUnit).toBe('eV');
    expect(rel(toCanonical(j, 1.602176634e-19), 1)).toBeLessThan(1e-12);
  });

  it('leaves dimensionless columns untouched', () => {
    expect(columnConversion('mu', '')).toMatchObject({ canonicalUnit: '1', scale: 1, offset: 0 });
    expect(toCanonical(columnConversion('mu', '1'), 0.1 + 0.2)).toBe(0.1 + 0.2);
  });

  it('names the column for unknown units and for units with a number', () => {
    for (const bad of ['volts-ish', 'sqrt(', '3 cm']) {
      let err: unknown;
      try {
        columnConversion('phi', bad);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(ValidationError);
      expect((err as ValidationError).details![0]).toMatchObject({ path: 'units.phi', column: 'phi' });
    }
  });
});
