/**
 * `cross-field` (SPEC §3.1): perpendicular fluid drifts in a magnetised cylindrical column.
 *
 * Geometry: B along +z, pressure falling outward (∇p points to the axis), radial field E_r
 * positive outward. Azimuthal components are signed, + = counter-clockwise seen from +z.
 * Closure p_j = C n_j^γ_j, so ∇p_j = γ_j k T_j ∇n_j. Temperatures are in volts (kT/e), so e
 * cancels in the drift formulas. Thermal speeds v_t = sqrt(kT/m) (NRL convention), ρ = v_t/ω_c.
 */
import {
  ELECTRON_MASS,
  ELEMENTARY_CHARGE,
  PROTON_MASS,
  VACUUM_PERMEABILITY,
  VACUUM_PERMITTIVITY,
} from '../constants.js';
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
    meaning: 'Ion mass in proton masses m_i/m_p (deuterium 2, argon 39.66).',
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
    meaning: 'Relative field change inside from pressure balance, sqrt(1−β) − 1 (−1 when β ≥ 1).',
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
    meaning: 'Ion sound speed sqrt((Z γ_e T_e + γ_i T_i) e/m_i).',
  },
  { name: 'rho_e_m', symbol: 'ρ_e', unit: 'm', kind: 'number', meaning: 'Electron gyroradius v_te/ω_ce.' },
  { name: 'rho_i_m', symbol: 'ρ_i', unit: 'm', kind: 'number', meaning: 'Ion gyroradius v_ti/ω_ci.' },
  { name: 'rho_s_m', symbol: 'ρ_s', unit: 'm', kind: 'number', meaning: 'Ion sound gyroradius c_s/ω_ci.' },
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
    meaning: 'Sound gyroradius over gradient length.',
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
  { name: 'valid', symbol: 'valid', unit: '1', kind: 'boolean', meaning: 'True when no validity flag is raised.' },
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
];

const INPUT_NAMES = inputs.map((i) => i.name);
const INVALID_MASK = invalidatingMask(flags);
const E = ELEMENTARY_CHARGE;
const TWO_MU0_E = 2 * VACUUM_PERMEABILITY * ELEMENTARY_CHARGE;
const E_OVER_ME = ELEMENTARY_CHARGE / ELECTRON_MASS;
const E_OVER_MP = ELEMENTARY_CHARGE / PROTON_MASS;
const EPS0_OVER_E = VACUUM_PERMITTIVITY / ELEMENTARY_CHARGE;

function evaluateChunk(inp: Record<string, Float64Array>, n: number, out: ChunkOutput, th?: Thresholds): void {
  const [Te, Ti, Bc, nc, Lc, ge, gi, Erc, muc, Zc] = inputColumns(INPUT_NAMES, inp, n) as [
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
  ];
  const [vE, vDe, vDi, jTh, betaC, dB, wce, wci, vte, vti, cs, rhoE, rhoI, rhoS, lD, rIL, rSL, lDL, vDiVti, valid] =
    outputColumns(outputs, out, n) as Float64Array[] as [
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
      Float64Array,
    ];
  const fl = out.flags;
  const rhoMax = thresholdValue(thresholds, th, 'rho_i_over_Ln_max');
  const ldMax = thresholdValue(thresholds, th, 'lambdaD_over_Ln_max');
  const betaMax = thresholdValue(thresholds, th, 'beta_max');

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
    const ni = ne / z;
    const invB = 1 / b;
    const invBL = invB / ln;

    const vde = gE * te * invBL;
    const vdi = (-gI * ti * invBL) / z;
    vE[k] = -er * invB;
    vDe[k] = vde;
    vDi[k] = vdi;
    // e(Z n_i v_iθ − n v_eθ) with Z n_i = n, so the E×B parts cancel exactly.
    jTh[k] = E * ne * (vdi - vde);

    const beta = TWO_MU0_E * (ne * te + ni * ti) * invB * invB;
    betaC[k] = beta;
    dB[k] = beta < 1 ? Math.sqrt(1 - beta) - 1 : -1;

    const eOverMi = E_OVER_MP / mu;
    const omce = E_OVER_ME * b;
    const omci = z * eOverMi * b;
    const vtE = Math.sqrt(E_OVER_ME * te);
    const vtI = Math.sqrt(eOverMi * ti);
    const c = Math.sqrt((z * gE * te + gI * ti) * eOverMi);
    const ri = vtI / omci;
    const rs = c / omci;
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
    const ldl = ld / ln;
    rIL[k] = ril;
    rSL[k] = rs / ln;
    lDL[k] = ldl;
    vDiVti[k] = -vdi / vtI;

    // Comparisons written so that NaN raises the flag (a NaN point is never "valid").
    let mask = 0;
    if (!(ril < rhoMax)) mask |= 1;
    if (!(ldl < ldMax)) mask |= 2;
    if (!(beta < betaMax)) mask |= 4;
    fl[k] = mask;
    valid[k] = mask & INVALID_MASK ? 0 : 1;
  }
}

export const crossField: ModelDefinition = {
  id: 'cross-field',
  version: '1.0.0',
  title: 'Cross-field drifts',
  summary:
    'E×B and diamagnetic drifts, diamagnetic current, beta and field depression, gyro-scales and the drift-ordering parameters at one point of a magnetised column.',
  inputs,
  outputs,
  flags,
  thresholds,
  evaluate(values, th) {
    return evaluateViaChunk(crossField, values, th);
  },
  evaluateChunk,
};
