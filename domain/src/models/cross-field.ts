/**
 * `cross-field` (SPEC §3.1): perpendicular fluid drifts in a magnetised cylindrical column.
 *
 * Geometry: B along +z, pressure falling outward (∇p points to the axis), radial field E_r
 * positive outward. Azimuthal components are signed, + = counter-clockwise seen from +z.
 * Closure p_j = C n_j^γ_j, so ∇p_j = γ_j k T_j ∇n_j. Temperatures are in volts (kT/e), so e
 * cancels in the drift formulas. Thermal speeds v_t = sqrt(kT/m) (NRL convention), ρ = v_t/ω_c.
 *
 * Version 2 adds collisions and magnetisation (collisions.ts holds the formulas and their sources):
 * Coulomb logarithms and rates from the NRL Plasma Formulary, neutral collision rates from the
 * parent gas, and the steady two-fluid momentum balance with friction,
 *   0 = q n (E + v×B) − ∇p − m n ν v,
 * which for the column gives the collisional azimuthal drifts (v_E + v_D)/(1 + ν²/ω_c²) and the
 * radial mobility/diffusion velocities (F. F. Chen, Introduction to Plasma Physics, "Diffusion
 * across a magnetic field"). Every version-1 output keeps its value except ρ_s (now c_s0/ω_ci, the
 * drift-wave convention) and ρ_s/L_n built from it; dB/B is now computed without cancellation.
 */
import {
  ELECTRON_MASS,
  ELEMENTARY_CHARGE,
  PROTON_MASS,
  SPEED_OF_LIGHT,
  VACUUM_PERMEABILITY,
  VACUUM_PERMITTIVITY,
} from '../constants.js';
import {
  coulombLogElectronIon,
  coulombLogIonIon,
  electronCollisionRate,
  fieldDepression,
  ionCollisionRate,
  meanRelativeSpeed,
  ROOM_TEMPERATURE_EV,
} from './collisions.js';
import { evaluateViaChunk, inputColumns, invalidatingMask, outputColumns, thresholdValue } from './common.js';
import type {
  ChunkOutput,
  FlagSpec,
  InputSpec,
  ModelDefinition,
  OutputSpec,
  ThresholdSpec,
  Thresholds,
} from './types.js';

const inputs: InputSpec[] = [
  {
    name: 'Te_eV',
    symbol: 'T_e',
    unit: 'eV',
    default: 10,
    min: 0,
    minExclusive: true,
    max: 1e6,
    meaning: 'Electron temperature.',
  },
  {
    name: 'Ti_eV',
    symbol: 'T_i',
    unit: 'eV',
    default: 10,
    min: 0,
    minExclusive: true,
    max: 1e6,
    meaning: 'Ion temperature.',
  },
  {
    name: 'B_T',
    symbol: 'B',
    unit: 'T',
    default: 0.5,
    min: 0,
    minExclusive: true,
    max: 100,
    meaning: 'Magnetic field strength along +z (vacuum field).',
  },
  {
    name: 'n_m3',
    symbol: 'n_e',
    unit: 'm^-3',
    default: 1e19,
    min: 0,
    minExclusive: true,
    max: 1e32,
    meaning: 'Electron density.',
  },
  {
    name: 'Ln_m',
    symbol: 'L_n',
    unit: 'm',
    default: 0.02,
    min: 0,
    minExclusive: true,
    max: 1e15,
    meaning: 'Density gradient length n/|∇n| (density falls outward).',
  },
  {
    name: 'gamma_e',
    symbol: 'γ_e',
    unit: '1',
    default: 1,
    min: 0,
    minExclusive: true,
    max: 10,
    meaning: 'Electron polytropic index (1 isothermal, 5/3 adiabatic).',
  },
  {
    name: 'gamma_i',
    symbol: 'γ_i',
    unit: '1',
    default: 1,
    min: 0,
    minExclusive: true,
    max: 10,
    meaning: 'Ion polytropic index (1 isothermal, 3 one-dimensional adiabatic).',
  },
  {
    name: 'Er_Vm',
    symbol: 'E_r',
    unit: 'V/m',
    default: 0,
    min: -1e12,
    max: 1e12,
    meaning: 'Radial electric field, positive outward.',
  },
  {
    name: 'mu',
    symbol: 'μ',
    unit: '1',
    default: 2,
    min: 1,
    max: 500,
    meaning: 'Ion mass in proton masses m_i/m_p (deuterium 2, argon 39.948 u = 39.6594 m_p).',
  },
  {
    name: 'Z',
    symbol: 'Z',
    unit: '1',
    default: 1,
    min: 1,
    max: 100,
    meaning: 'Ion charge state; ion density n_i = n_e/Z.',
  },
  {
    name: 'nn_m3',
    symbol: 'n_n',
    unit: 'm^-3',
    default: 0,
    min: 0,
    max: 1e30,
    pressureAt: 'Tn_eV',
    meaning:
      'Neutral density of the parent gas (neutral mass = ion mass); 0 means no neutrals. A pressure p gives n_n = p/(k_B T_n).',
  },
  {
    name: 'Tn_eV',
    symbol: 'T_n',
    unit: 'eV',
    default: ROOM_TEMPERATURE_EV,
    min: 0,
    minExclusive: true,
    max: 1e4,
    meaning: 'Neutral temperature (default room temperature, 300 K = 0.02585 eV).',
  },
  {
    name: 'sigma_in_m2',
    symbol: 'σ_in',
    unit: 'm^2',
    default: 1e-18,
    min: 0,
    max: 1e-15,
    meaning:
      'Ion–neutral momentum-transfer cross-section (default 1e-18 m², typical of Ar⁺ on Ar at low energy, charge exchange dominated: Lieberman & Lichtenberg, Principles of Plasma Discharges, ch. 3; from memory).',
  },
  {
    name: 'sigma_en_m2',
    symbol: 'σ_en',
    unit: 'm^2',
    default: 1e-19,
    min: 0,
    max: 1e-15,
    meaning:
      'Electron–neutral momentum-transfer cross-section (default 1e-19 m², typical of argon at a few eV: Lieberman & Lichtenberg, ch. 3; from memory).',
  },
];

const outputs: OutputSpec[] = [
  {
    name: 'vE_ms',
    symbol: 'v_E',
    unit: 'm/s',
    kind: 'number',
    meaning: 'E×B drift, azimuthal (+ counter-clockwise from +z), same for both species: −E_r/B.',
  },
  {
    name: 'vDe_ms',
    symbol: 'v_De',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Electron diamagnetic drift, azimuthal: +γ_e T_e/(B L_n).',
  },
  {
    name: 'vDi_ms',
    symbol: 'v_Di',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Ion diamagnetic drift, azimuthal: −γ_i T_i/(Z B L_n), opposite to the electrons.',
  },
  {
    name: 'jTheta_Am2',
    symbol: 'j_θ',
    unit: 'A/m^2',
    kind: 'number',
    meaning: 'Diamagnetic current density, azimuthal: −|∇p|/B (E×B cancels).',
  },
  { name: 'beta', symbol: 'β', unit: '1', kind: 'number', meaning: 'Total plasma beta 2μ0 e (n T_e + n_i T_i)/B².' },
  {
    name: 'dB_over_B',
    symbol: 'ΔB/B',
    unit: '1',
    kind: 'number',
    meaning:
      'Relative field change inside from pressure balance, sqrt(1−β) − 1 = −β/(1 + sqrt(1−β)) (computed in the second form, −1 when β ≥ 1).',
  },
  { name: 'omega_ce', symbol: 'ω_ce', unit: 'rad/s', kind: 'number', meaning: 'Electron gyrofrequency eB/m_e.' },
  { name: 'omega_ci', symbol: 'ω_ci', unit: 'rad/s', kind: 'number', meaning: 'Ion gyrofrequency ZeB/m_i.' },
  { name: 'vte_ms', symbol: 'v_te', unit: 'm/s', kind: 'number', meaning: 'Electron thermal speed sqrt(kT_e/m_e).' },
  { name: 'vti_ms', symbol: 'v_ti', unit: 'm/s', kind: 'number', meaning: 'Ion thermal speed sqrt(kT_i/m_i).' },
  {
    name: 'cs_ms',
    symbol: 'c_s',
    unit: 'm/s',
    kind: 'number',
    meaning:
      'Ion sound speed sqrt((Z γ_e T_e + γ_i T_i) e/m_i), with the polytropic indices and the ion temperature (ρ_s uses the cold-ion c_s0 instead).',
  },
  { name: 'rho_e_m', symbol: 'ρ_e', unit: 'm', kind: 'number', meaning: 'Electron gyroradius v_te/ω_ce.' },
  { name: 'rho_i_m', symbol: 'ρ_i', unit: 'm', kind: 'number', meaning: 'Ion gyroradius v_ti/ω_ci.' },
  {
    name: 'rho_s_m',
    symbol: 'ρ_s',
    unit: 'm',
    kind: 'number',
    meaning:
      'Ion sound gyroradius of the drift-wave literature, c_s0/ω_ci with c_s0 = sqrt(Z e T_e/m_i) (cold ions, isothermal electrons; Horton, Rev. Mod. Phys. 71, 735 (1999)). Version 1 used c_s/ω_ci.',
  },
  { name: 'lambdaD_m', symbol: 'λ_D', unit: 'm', kind: 'number', meaning: 'Electron Debye length sqrt(ε0 T_e/(e n)).' },
  {
    name: 'rho_i_over_Ln',
    symbol: 'ρ_i/L_n',
    unit: '1',
    kind: 'number',
    meaning: 'Ion gyroradius over gradient length; the drift ordering needs ≪ 1.',
  },
  {
    name: 'rho_s_over_Ln',
    symbol: 'ρ_s/L_n',
    unit: '1',
    kind: 'number',
    meaning: 'Sound gyroradius over gradient length; the drift-wave ordering needs ≪ 1.',
  },
  {
    name: 'lambdaD_over_Ln',
    symbol: 'λ_D/L_n',
    unit: '1',
    kind: 'number',
    meaning: 'Debye length over gradient length; quasi-neutrality needs ≪ 1.',
  },
  {
    name: 'vDi_over_vti',
    symbol: '|v_Di|/v_ti',
    unit: '1',
    kind: 'number',
    meaning: 'Ion diamagnetic drift over ion thermal speed (= γ_i ρ_i/L_n).',
  },
  {
    name: 'lnLambda_ei',
    group: 'collisions',
    symbol: 'lnΛ_ei',
    unit: '1',
    kind: 'number',
    meaning:
      'Electron–ion Coulomb logarithm (NRL Plasma Formulary, n in cm⁻³, T in eV): 23 − ln(n_e^½ Z T_e^−3/2) for T_e ≤ 10 Z² eV, else 24 − ln(n_e^½/T_e).',
  },
  {
    name: 'lnLambda_ii',
    group: 'collisions',
    symbol: 'lnΛ_ii',
    unit: '1',
    kind: 'number',
    meaning: 'Ion–ion Coulomb logarithm for like ions (NRL Plasma Formulary): 23 − ln[(Z²/T_i)(2 n_i Z²/T_i)^½].',
  },
  {
    name: 'nu_ei_s',
    group: 'collisions',
    symbol: 'ν_ei',
    unit: '1/s',
    kind: 'number',
    meaning:
      'Electron collision rate 2.91e-6 n_e lnΛ_ei T_e^−3/2 (NRL ν_e = 1/τ_e of Braginskii; CODATA 2018 coefficient 2.9063e-6; lnΛ floored at 1).',
  },
  {
    name: 'nu_ii_s',
    group: 'collisions',
    symbol: 'ν_ii',
    unit: '1/s',
    kind: 'number',
    meaning:
      'Ion collision rate 4.80e-8 Z⁴ μ^−½ n_i lnΛ_ii T_i^−3/2 (NRL ν_i = 1/τ_i of Braginskii; lnΛ floored at 1). Like-particle collisions carry no net momentum out of the ions, so it is not a friction rate.',
  },
  {
    name: 'nu_in_s',
    group: 'collisions',
    symbol: 'ν_in',
    unit: '1/s',
    kind: 'number',
    meaning: 'Ion–neutral collision rate n_n σ_in v̄, v̄ = sqrt(8 e (T_i/m_i + T_n/m_n)/π), m_n = m_i.',
  },
  {
    name: 'nu_en_s',
    group: 'collisions',
    symbol: 'ν_en',
    unit: '1/s',
    kind: 'number',
    meaning: 'Electron–neutral collision rate n_n σ_en v̄, v̄ = sqrt(8 e (T_e/m_e + T_n/m_n)/π).',
  },
  {
    name: 'nu_e_s',
    group: 'collisions',
    symbol: 'ν_e',
    unit: '1/s',
    kind: 'number',
    meaning: 'Electron friction rate ν_ei + ν_en (ions taken at rest for the electron–ion friction).',
  },
  {
    name: 'nu_i_s',
    group: 'collisions',
    symbol: 'ν_i',
    unit: '1/s',
    kind: 'number',
    meaning:
      'Ion friction rate ν_in. Ion–ion collisions carry no net momentum; electron–ion friction on the ions is smaller than on the electrons by m_e/m_i and is left out.',
  },
  {
    name: 'nu_over_omega_e',
    symbol: 'ν_e/ω_ce',
    unit: '1',
    kind: 'number',
    meaning: 'Electron collisionality against gyration; electrons are magnetised when ≪ 1.',
  },
  {
    name: 'nu_over_omega_i',
    symbol: 'ν_i/ω_ci',
    unit: '1',
    kind: 'number',
    meaning: 'Ion collisionality against gyration; ions are magnetised when ≪ 1.',
  },
  {
    name: 'vTheta_e_ms',
    group: 'collisions',
    symbol: 'v_eθ',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Collisional electron azimuthal drift (v_E + v_De)/(1 + ν_e²/ω_ce²) (Chen, diffusion across B).',
  },
  {
    name: 'vTheta_i_ms',
    group: 'collisions',
    symbol: 'v_iθ',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Collisional ion azimuthal drift (v_E + v_Di)/(1 + ν_i²/ω_ci²) (Chen, diffusion across B).',
  },
  {
    name: 'vr_e_ms',
    group: 'collisions',
    symbol: 'v_er',
    unit: 'm/s',
    kind: 'number',
    meaning:
      'Electron radial velocity (+ outward) −μ⊥e E_r + γ_e D⊥e/L_n, μ⊥ = |q|ν/(m(ω_c² + ν²)), D⊥ = e T ν/(m(ω_c² + ν²)).',
  },
  {
    name: 'vr_i_ms',
    group: 'collisions',
    symbol: 'v_ir',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Ion radial velocity (+ outward) +μ⊥i E_r + γ_i D⊥i/L_n (same mobility and diffusion coefficients).',
  },
  {
    name: 'vTheta_i_ratio',
    group: 'collisions',
    symbol: 'v_iθ/v_iθ,0',
    unit: '1',
    kind: 'number',
    meaning: 'Fraction of the collisionless ion drift that survives the friction, 1/(1 + ν_i²/ω_ci²).',
  },
  {
    name: 'D_Bohm_m2s',
    group: 'collisions',
    symbol: 'D_B',
    unit: 'm^2/s',
    kind: 'number',
    meaning: 'Bohm diffusion coefficient T_e/(16 B) (T_e in volts), for comparison (NRL Plasma Formulary).',
  },
  {
    name: 'v_over_c',
    symbol: 'v/c',
    unit: '1',
    kind: 'number',
    meaning: 'Larger of |v_E| and v_te over the speed of light; the non-relativistic drifts need ≪ 1.',
  },
  { name: 'valid', symbol: 'valid', unit: '1', kind: 'boolean', meaning: 'True when no invalidating flag is raised.' },
];

const flags: FlagSpec[] = [
  {
    code: 'rho_i_over_Ln',
    bit: 0,
    invalidates: true,
    meaning:
      'Ion gyroradius is not small against the gradient length (ρ_i/L_n ≥ threshold): the fluid drift ordering breaks down.',
  },
  {
    code: 'lambdaD_over_Ln',
    bit: 1,
    invalidates: true,
    meaning:
      'Debye length is not small against the gradient length (λ_D/L_n ≥ threshold): the plasma is not quasi-neutral on that scale.',
  },
  {
    code: 'beta',
    bit: 2,
    invalidates: true,
    meaning:
      'Plasma pressure reaches the magnetic pressure (β ≥ threshold): the vacuum-field assumption fails (β ≥ 1 has no pressure-balance solution).',
  },
  {
    code: 'unmagnetised_ions',
    ordering: { output: 'nu_over_omega_i', threshold: 'nu_over_omega_i_max' },
    bit: 3,
    invalidates: true,
    meaning:
      'Ions collide with neutrals at least as often as they gyrate (ν_i/ω_ci ≥ threshold): the collisionless ion drifts do not hold; see vTheta_i_ms and vr_i_ms.',
  },
  {
    code: 'unmagnetised_electrons',
    ordering: { output: 'nu_over_omega_e', threshold: 'nu_over_omega_e_max' },
    bit: 4,
    invalidates: true,
    meaning:
      'Electrons collide at least as often as they gyrate (ν_e/ω_ce ≥ threshold): the collisionless electron drifts do not hold; see vTheta_e_ms and vr_e_ms.',
  },
  {
    code: 'relativistic',
    ordering: { output: 'v_over_c', threshold: 'v_over_c_max' },
    bit: 5,
    invalidates: true,
    meaning: 'The E×B drift or the electron thermal speed is not small against c (v/c ≥ threshold).',
  },
  {
    code: 'rho_s_over_Ln',
    bit: 6,
    invalidates: true,
    meaning:
      'The ion sound gyroradius ρ_s is not small against the gradient length (ρ_s/L_n ≥ threshold): the drift ordering breaks down even for cold ions.',
  },
];

const thresholds: ThresholdSpec[] = [
  {
    name: 'rho_i_over_Ln_max',
    default: 0.1,
    meaning: 'Flag rho_i_over_Ln when ρ_i/L_n ≥ this (0.1 is common practice).',
  },
  {
    name: 'lambdaD_over_Ln_max',
    default: 0.1,
    meaning: 'Flag lambdaD_over_Ln when λ_D/L_n ≥ this (0.1 is common practice).',
  },
  { name: 'beta_max', default: 1, meaning: 'Flag beta when β ≥ this (1: no pressure balance possible).' },
  {
    name: 'nu_over_omega_i_max',
    default: 1,
    meaning: 'Flag unmagnetised_ions when ν_i/ω_ci ≥ this (1: a collision per radian of gyration).',
  },
  {
    name: 'nu_over_omega_e_max',
    default: 1,
    meaning: 'Flag unmagnetised_electrons when ν_e/ω_ce ≥ this (1: a collision per radian of gyration).',
  },
  { name: 'v_over_c_max', default: 0.1, meaning: 'Flag relativistic when v/c ≥ this (0.1 is common practice).' },
  {
    name: 'rho_s_over_Ln_max',
    default: 0.1,
    meaning: 'Flag rho_s_over_Ln when ρ_s/L_n ≥ this (0.1 is common practice).',
  },
];

const INPUT_NAMES = inputs.map((i) => i.name);
const INVALID_MASK = invalidatingMask(flags);
const E = ELEMENTARY_CHARGE;
const TWO_MU0_E = 2 * VACUUM_PERMEABILITY * ELEMENTARY_CHARGE;
const E_OVER_ME = ELEMENTARY_CHARGE / ELECTRON_MASS;
const E_OVER_MP = ELEMENTARY_CHARGE / PROTON_MASS;
const EPS0_OVER_E = VACUUM_PERMITTIVITY / ELEMENTARY_CHARGE;
const INV_C = 1 / SPEED_OF_LIGHT;

type Columns<N extends number, T extends Float64Array[] = []> = T['length'] extends N
  ? T
  : Columns<N, [...T, Float64Array]>;

function evaluateChunk(inp: Record<string, Float64Array>, n: number, out: ChunkOutput, th?: Thresholds): void {
  const [Te, Ti, Bc, nc, Lc, ge, gi, Erc, muc, Zc, nnc, Tnc, sInc, sEnc] = inputColumns(
    INPUT_NAMES,
    inp,
    n,
  ) as Columns<14>;
  const [
    vE,
    vDe,
    vDi,
    jTh,
    betaC,
    dB,
    wce,
    wci,
    vte,
    vti,
    cs,
    rhoE,
    rhoI,
    rhoS,
    lD,
    rIL,
    rSL,
    lDL,
    vDiVti,
    lnEI,
    lnII,
    nuEI,
    nuII,
    nuIN,
    nuEN,
    nuE,
    nuI,
    xE,
    xI,
    vThE,
    vThI,
    vrE,
    vrI,
    vThIRatio,
    dBohm,
    vOverC,
    valid,
  ] = outputColumns(outputs, out, n) as Columns<37>;
  const fl = out.flags;
  const rhoMax = thresholdValue(thresholds, th, 'rho_i_over_Ln_max');
  const ldMax = thresholdValue(thresholds, th, 'lambdaD_over_Ln_max');
  const betaMax = thresholdValue(thresholds, th, 'beta_max');
  const xiMax = thresholdValue(thresholds, th, 'nu_over_omega_i_max');
  const xeMax = thresholdValue(thresholds, th, 'nu_over_omega_e_max');
  const vcMax = thresholdValue(thresholds, th, 'v_over_c_max');
  const rhoSMax = thresholdValue(thresholds, th, 'rho_s_over_Ln_max');

  for (let k = 0; k < n; k++) {
    const te = Te[k]!,
      ti = Ti[k]!,
      b = Bc[k]!,
      ne = nc[k]!,
      ln = Lc[k]!;
    const gE = ge[k]!,
      gI = gi[k]!,
      er = Erc[k]!,
      mu = muc[k]!,
      z = Zc[k]!;
    const nn = nnc[k]!,
      tn = Tnc[k]!;
    const ni = ne / z;
    const invB = 1 / b;
    const invBL = invB / ln;

    const vde = gE * te * invBL;
    const vdi = (-gI * ti * invBL) / z;
    const ve = -er * invB;
    vE[k] = ve;
    vDe[k] = vde;
    vDi[k] = vdi;
    // e(Z n_i v_iθ − n v_eθ) with Z n_i = n, so the E×B parts cancel exactly.
    jTh[k] = E * ne * (vdi - vde);

    const beta = TWO_MU0_E * (ne * te + ni * ti) * invB * invB;
    betaC[k] = beta;
    dB[k] = fieldDepression(beta);

    const eOverMi = E_OVER_MP / mu;
    const omce = E_OVER_ME * b;
    const omci = z * eOverMi * b;
    const vtE = Math.sqrt(E_OVER_ME * te);
    const vtI = Math.sqrt(eOverMi * ti);
    const c = Math.sqrt((z * gE * te + gI * ti) * eOverMi);
    const ri = vtI / omci;
    // Drift-wave ρ_s = c_s0/ω_ci with c_s0 = sqrt(Z e T_e/m_i) (cold ions, isothermal electrons).
    const rs = Math.sqrt(z * te * eOverMi) / omci;
    const ld = Math.sqrt((EPS0_OVER_E * te) / ne);
    wce[k] = omce;
    wci[k] = omci;
    vte[k] = vtE;
    vti[k] = vtI;
    cs[k] = c;
    rhoE[k] = vtE / omce;
    rhoI[k] = ri;
    rhoS[k] = rs;
    lD[k] = ld;
    const ril = ri / ln;
    const rsl = rs / ln;
    const ldl = ld / ln;
    rIL[k] = ril;
    rSL[k] = rsl;
    lDL[k] = ldl;
    vDiVti[k] = -vdi / vtI;

    // Collisions (collisions.ts): Coulomb rates from the NRL Plasma Formulary, neutral rates n σ v̄.
    const mi = mu * PROTON_MASS;
    const lei = coulombLogElectronIon(ne, te, z);
    const lii = coulombLogIonIon(ni, ti, z);
    const nuei = electronCollisionRate(ne, te, lei);
    const nuii = ionCollisionRate(ni, ti, z, mu, lii);
    const nuin = nn * sInc[k]! * meanRelativeSpeed(ti, mi, tn, mi);
    const nuen = nn * sEnc[k]! * meanRelativeSpeed(te, ELECTRON_MASS, tn, mi);
    const nue = nuei + nuen;
    const nui = nuin;
    const xe = nue / omce;
    const xi = nui / omci;
    lnEI[k] = lei;
    lnII[k] = lii;
    nuEI[k] = nuei;
    nuII[k] = nuii;
    nuIN[k] = nuin;
    nuEN[k] = nuen;
    nuE[k] = nue;
    nuI[k] = nui;
    xE[k] = xe;
    xI[k] = xi;
    // Friction balance (Chen, diffusion across B): v_θ = (v_E + v_D)/(1 + x²), v_r = −sign(q) x v_θ,
    // i.e. sign(q) μ⊥ E_r + γ D⊥/L_n with μ⊥ = |q|ν/(m(ω_c² + ν²)), D⊥ = e T ν/(m(ω_c² + ν²)).
    const fe = 1 / (1 + xe * xe);
    const fi = 1 / (1 + xi * xi);
    const vthe = (ve + vde) * fe;
    const vthi = (ve + vdi) * fi;
    vThE[k] = vthe;
    vThI[k] = vthi;
    vrE[k] = xe * vthe; // electrons: −sign(−e) = +1
    vrI[k] = -xi * vthi;
    vThIRatio[k] = fi;
    dBohm[k] = (te * invB) / 16;
    const vmax = Math.abs(ve) > vtE ? Math.abs(ve) : vtE;
    const voc = vmax * INV_C;
    vOverC[k] = voc;

    // Comparisons written so that NaN raises the flag (a NaN point is never "valid").
    let mask = 0;
    if (!(ril < rhoMax)) mask |= 1;
    if (!(ldl < ldMax)) mask |= 2;
    if (!(beta < betaMax)) mask |= 4;
    if (!(xi < xiMax)) mask |= 8;
    if (!(xe < xeMax)) mask |= 16;
    if (!(voc < vcMax)) mask |= 32;
    if (!(rsl < rhoSMax)) mask |= 64;
    fl[k] = mask;
    valid[k] = mask & INVALID_MASK ? 0 : 1;
  }
}

const orderings = [
  { output: 'rho_i_over_Ln', threshold: 'rho_i_over_Ln_max' },
  { output: 'rho_s_over_Ln', threshold: 'rho_s_over_Ln_max' },
  { output: 'lambdaD_over_Ln', threshold: 'lambdaD_over_Ln_max' },
  { output: 'beta', threshold: 'beta_max' },
  { output: 'nu_over_omega_i', threshold: 'nu_over_omega_i_max' },
  { output: 'nu_over_omega_e', threshold: 'nu_over_omega_e_max' },
  { output: 'v_over_c', threshold: 'v_over_c_max' },
  // γ_i ρ_i/L_n: watched through rho_i_over_Ln only.
  { output: 'vDi_over_vti', threshold: null },
];

export const crossField: ModelDefinition = {
  id: 'cross-field',
  version: '2.0.0',
  title: 'Cross-field drifts',
  summary:
    'E×B and diamagnetic drifts, diamagnetic current, beta and field depression, gyro-scales, Coulomb and neutral collision rates, magnetisation and the collisional drifts, and the drift-ordering parameters at one point of a magnetised column.',
  inputs,
  outputs,
  flags,
  thresholds,
  orderings,
  evaluate(values, th) {
    return evaluateViaChunk(crossField, values, th);
  },
  evaluateChunk,
};
