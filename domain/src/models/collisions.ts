/**
 * Collision formulas shared by the models, scalar and allocation-free (called per point from the
 * chunk kernels). Units: n in m⁻³, T in eV, masses in kg, results in SI.
 *
 * Sources
 * - Coulomb logarithms: NRL Plasma Formulary (J. D. Huba, NRL), "Collisions and transport",
 *   electron–ion and like-ion formulas with n in cm⁻³ and T in eV. The formulary's third
 *   electron–ion branch (T_e < T_i m_e/m_i, electrons slower than ions) is not modelled: the
 *   first branch is used there.
 * - Rates: NRL Plasma Formulary ν_e = 2.91e-6 n_e lnΛ T_e^−3/2 and ν_i = 4.80e-8 Z⁴ μ^−½ n_i lnΛ
 *   T_i^−3/2 s⁻¹, which are 1/τ_e and 1/τ_i of S. I. Braginskii, "Transport processes in a
 *   plasma", Rev. Plasma Phys. 1 (1965). The coefficients here are Braginskii's definitions
 *   evaluated with CODATA 2018 constants (2.9063e-6 and 4.7959e-8), which reproduce the printed
 *   three figures (tests/reference/physics/nrl_coefficients_check.csv).
 * - Neutral collisions: ν = n_n σ v̄ with the mean relative speed of two Maxwellians
 *   v̄ = sqrt(8 e (T_j/m_j + T_n/m_n)/π) (kinetic theory; common practice).
 */
import { ELECTRON_MASS, ELEMENTARY_CHARGE, PROTON_MASS, VACUUM_PERMITTIVITY } from '../constants.js';

/** Room temperature, 300 K in eV to 5 significant figures (k_B·300 K/e = 0.0258520 eV; common practice). */
export const ROOM_TEMPERATURE_EV = 0.025852;

const E = ELEMENTARY_CHARGE;
/** 1/τ_e = NU_E · n_cm3 lnΛ T_e^−3/2: e⁴/(6√2 π^3/2 ε0² √m_e e^3/2) × 1e6 (m⁻³ per cm⁻³). */
export const NU_E_COEFF =
  (E ** 2.5 * 1e6) / (6 * Math.SQRT2 * Math.PI ** 1.5 * VACUUM_PERMITTIVITY ** 2 * Math.sqrt(ELECTRON_MASS));
/** 1/τ_i = NU_I · Z⁴ μ^−½ n_i,cm3 lnΛ T_i^−3/2: e⁴/(12 π^3/2 ε0² √m_p e^3/2) × 1e6. */
export const NU_I_COEFF = (E ** 2.5 * 1e6) / (12 * Math.PI ** 1.5 * VACUUM_PERMITTIVITY ** 2 * Math.sqrt(PROTON_MASS));
/**
 * Below this the Coulomb logarithm no longer describes weakly coupled collisions; the rates use
 * max(lnΛ, LN_LAMBDA_FLOOR) so that they stay positive (the lnΛ outputs are reported unfloored).
 */
export const LN_LAMBDA_FLOOR = 1;

/** NRL electron–ion Coulomb logarithm; n_e in m⁻³, T_e in eV. */
export function coulombLogElectronIon(ne: number, te: number, z: number): number {
  const nCm3 = ne * 1e-6;
  // 23 − ln(n^½ Z T^−3/2) = 23 − ½ ln n − ln Z + 3/2 ln T; 24 − ln(n^½/T) = 24 − ½ ln n + ln T.
  return te <= 10 * z * z
    ? 23 - 0.5 * Math.log(nCm3) - Math.log(z) + 1.5 * Math.log(te)
    : 24 - 0.5 * Math.log(nCm3) + Math.log(te);
}

/** NRL Coulomb logarithm for like ions: 23 − ln[(Z²/T_i)(2 n_i Z²/T_i)^½]; n_i in m⁻³, T_i in eV. */
export function coulombLogIonIon(ni: number, ti: number, z: number): number {
  const z2OverT = (z * z) / ti;
  return 23 - Math.log(z2OverT * Math.sqrt(2 * ni * 1e-6 * z2OverT));
}

/** Electron collision rate 1/τ_e [s⁻¹]; n_e in m⁻³, T_e in eV. */
export function electronCollisionRate(ne: number, te: number, lnLambda: number): number {
  const ln = lnLambda > LN_LAMBDA_FLOOR ? lnLambda : LN_LAMBDA_FLOOR;
  return (NU_E_COEFF * ne * 1e-6 * ln) / (te * Math.sqrt(te));
}

/** Ion collision rate 1/τ_i [s⁻¹]; n_i in m⁻³, T_i in eV, μ = m_i/m_p. */
export function ionCollisionRate(ni: number, ti: number, z: number, mu: number, lnLambda: number): number {
  const ln = lnLambda > LN_LAMBDA_FLOOR ? lnLambda : LN_LAMBDA_FLOOR;
  const z2 = z * z;
  return (NU_I_COEFF * z2 * z2 * ni * 1e-6 * ln) / (Math.sqrt(mu) * ti * Math.sqrt(ti));
}

/** Mean relative speed of two Maxwellians [m/s]: sqrt(8 e (T_a/m_a + T_b/m_b)/π), T in eV, m in kg. */
export function meanRelativeSpeed(ta: number, ma: number, tb: number, mb: number): number {
  return Math.sqrt(((8 * E) / Math.PI) * (ta / ma + tb / mb));
}

/** Relative field change sqrt(1 − β) − 1 written as −β/(1 + sqrt(1 − β)) (no cancellation); −1 for β ≥ 1. */
export function fieldDepression(beta: number): number {
  return beta < 1 ? -beta / (1 + Math.sqrt(1 - beta)) : -1;
}
