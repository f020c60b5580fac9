import { describe, expect, it } from 'vitest';
import { math } from './units/math.js';
import {
  BOLTZMANN,
  ELECTRON_MASS,
  ELEMENTARY_CHARGE,
  KELVIN_PER_EV,
  PROTON_MASS,
  SPEED_OF_LIGHT,
  VACUUM_PERMEABILITY,
  VACUUM_PERMITTIVITY,
} from './constants.js';

describe('CODATA 2018 constants', () => {
  // Source: CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)), NIST allascii.txt,
  // 2018 adjustment; values as in tests/reference/physics/README.md.
  it('match the CODATA 2018 table', () => {
    expect(ELEMENTARY_CHARGE).toBe(1.602176634e-19);
    expect(ELECTRON_MASS).toBe(9.1093837015e-31);
    expect(PROTON_MASS).toBe(1.67262192369e-27);
    expect(VACUUM_PERMITTIVITY).toBe(8.8541878128e-12);
    expect(VACUUM_PERMEABILITY).toBe(1.25663706212e-6);
    expect(BOLTZMANN).toBe(1.380649e-23);
    expect(SPEED_OF_LIGHT).toBe(299792458);
    // CODATA 2018 proton–electron mass ratio 1836.15267343(11).
    expect(PROTON_MASS / ELECTRON_MASS).toBeCloseTo(1836.15267343, 6);
    // ε0 μ0 c² = 1 holds to the 2018 uncertainty (~1.5e-10 relative).
    expect(Math.abs(VACUUM_PERMITTIVITY * VACUUM_PERMEABILITY * SPEED_OF_LIGHT ** 2 - 1)).toBeLessThan(1e-9);
  });

  it('are not the CODATA 2022 or 2010 sets', () => {
    // CODATA 2022 m_e = 9.1093837139e-31, CODATA 2010 m_e = 9.10938291e-31 (SciPy txt2022/txt2010 tables).
    expect(ELECTRON_MASS).not.toBe(9.1093837139e-31);
    expect(ELECTRON_MASS).not.toBe(9.10938291e-31);
  });

  // Reference library: mathjs physical constants (CODATA 2018 since mathjs v6.0.0), read at run time.
  it('agree with the physical constants mathjs ships', () => {
    expect(math.elementaryCharge.toNumber('C')).toBe(ELEMENTARY_CHARGE);
    expect(math.electronMass.toNumber('kg')).toBe(ELECTRON_MASS);
    expect(math.protonMass.toNumber('kg')).toBe(PROTON_MASS);
    expect(math.electricConstant.toNumber('F/m')).toBeCloseTo(VACUUM_PERMITTIVITY, 22);
    expect(math.electricConstant.toNumber('F/m') / VACUUM_PERMITTIVITY).toBeCloseTo(1, 14);
    expect(math.magneticConstant.toNumber('N/A^2') / VACUUM_PERMEABILITY).toBeCloseTo(1, 14);
    expect(math.boltzmann.toNumber('J/K')).toBe(BOLTZMANN);
    expect(math.speedOfLight.toNumber('m/s')).toBe(SPEED_OF_LIGHT);
  });

  it('give 1 eV ≈ 11604.518 K', () => {
    // CODATA 2018 electron volt–kelvin relationship 1.160451812e4 K (exact).
    expect(KELVIN_PER_EV).toBeCloseTo(11604.51812, 4);
  });
});
