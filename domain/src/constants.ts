/**
 * Physical constants, CODATA 2018 recommended values (SI).
 *
 * Source: E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, "CODATA recommended values of the
 * fundamental physical constants: 2018", Rev. Mod. Phys. 93, 025010 (2021); NIST table
 * https://physics.nist.gov/cuu/Constants/Table/allascii.txt ("2018 CODATA adjustment").
 * e, k_B and c are exact since the 2019 SI redefinition. constants.spec.ts compares these with the
 * values mathjs ships (also CODATA 2018 since mathjs v6).
 */

/** Elementary charge e [C] (exact). */
export const ELEMENTARY_CHARGE = 1.602176634e-19;
/** Electron mass m_e [kg]. */
export const ELECTRON_MASS = 9.1093837015e-31;
/** Proton mass m_p [kg]. */
export const PROTON_MASS = 1.67262192369e-27;
/** Vacuum electric permittivity ε0 [F/m]. */
export const VACUUM_PERMITTIVITY = 8.8541878128e-12;
/** Vacuum magnetic permeability μ0 [N/A²] (no longer exactly 4π×10⁻⁷ after 2019). */
export const VACUUM_PERMEABILITY = 1.25663706212e-6;
/** Atomic mass constant m_u = 1 u [kg] (unified atomic mass unit). */
export const ATOMIC_MASS_CONSTANT = 1.6605390666e-27;
/** Boltzmann constant k_B [J/K] (exact). */
export const BOLTZMANN = 1.380649e-23;
/** Speed of light in vacuum c [m/s] (exact). */
export const SPEED_OF_LIGHT = 299792458;

/** Kelvin per electronvolt of temperature: e / k_B. */
export const KELVIN_PER_EV = ELEMENTARY_CHARGE / BOLTZMANN;

/** Standard atomic weight of argon, 39.948 (IUPAC 2013 abridged value; FROM MEMORY, common practice). */
export const ARGON_ATOMIC_WEIGHT = 39.948;
/** Argon ion mass in proton masses as the registry states it: 39.948 u / m_p = 39.6594195574… */
export const ARGON_MU = (ARGON_ATOMIC_WEIGHT * ATOMIC_MASS_CONSTANT) / PROTON_MASS;

/** Short aliases for formulas. */
export const CODATA2018 = Object.freeze({
  e: ELEMENTARY_CHARGE,
  m_e: ELECTRON_MASS,
  m_p: PROTON_MASS,
  eps0: VACUUM_PERMITTIVITY,
  mu0: VACUUM_PERMEABILITY,
  k_B: BOLTZMANN,
  c: SPEED_OF_LIGHT,
});
