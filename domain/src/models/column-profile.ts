/**
 * `column-profile` (SPEC §3.3): radial profiles of a Gaussian column, integrated on a radial grid
 * for every point.
 *
 * n(r) = n0 exp(−r²/a²), T_j(r) = T_j0 (n/n0)^(γ_j−1), so p_j(r) = p_j0 exp(−γ_j r²/a²) and
 * dp_j/dr = −(2r/a²) γ_j p_j (used analytically, no finite differences); φ(r) = φ0 exp(−r²/a²),
 * E_r = −dφ/dr. B(r) from pressure balance B² = B0² − 2μ0 p(r) (B0 = vacuum field), and the local
 * B is used in the drifts. 1/L_n(r) = 2r/a².
 *
 * Integrals (flux_Wb = ∫(B−B0) 2πr dr, Wperp_Jm = ∫p 2πr dr over 0 ≤ r ≤ rmax) use the trapezoid
 * rule with its Euler–Maclaurin end correction −h²/12·[g′(rmax) − g′(0)], built from the analytic
 * derivatives, which makes it fourth order at no extra cost. Measured against the closed-form
 * results (column-profile.spec.ts), rmax = 3a: relative error 3.2e-10 (γ = 1) and 8.9e-10
 * (γ = 5/3) at nr = 256; 8.5e-8 / 2.4e-7 at nr = 64; 1.2e-12 / 3.4e-12 at nr = 1024 (h⁴). Plain
 * trapezoid would be ≈ 2e-5 at nr = 256. B − B0 is computed as −2μ0p/(B + B0) to avoid
 * cancellation at low β.
 *
 * Peaks and ordering maxima are taken over the core r ≤ 2a (beyond it n < 2 % of n0 and the
 * isothermal drifts grow without bound with r, so a maximum over the whole grid would only
 * measure rmax). Version 1.1 evaluates r = 2a itself (it rarely falls on a node) and flags
 * `peak_at_window_edge` when a peak lies there, i.e. the drift still grows at the edge and the
 * "peak" measures the window; the drifts at r = a are reported as well-defined alternatives.
 *
 * Radial resolution (version 1.1): the integrals are repeated on a grid of ⌈nr/2⌉ nodes over the
 * same interval; |I_nr − I_nr/2|/|I_nr| (largest of flux and W⊥) estimates the error from above
 * (for the h⁴ rule the error of I_nr is about 1/15 of it) and flags `under_resolved` past 1e-4.
 */
import { ELEMENTARY_CHARGE, PROTON_MASS, VACUUM_PERMEABILITY, VACUUM_PERMITTIVITY } from '../constants.js';
import { fieldDepression } from './collisions.js';
import { evaluateViaChunk, inputColumns, invalidatingMask, outputColumns, thresholdValue } from './common.js';
import type {
  ChunkOutput,
  FlagSpec,
  InputSpec,
  ModelDefinition,
  OutputSpec,
  Profile,
  ThresholdSpec,
  Thresholds,
} from './types.js';

const inputs: InputSpec[] = [
  {
    name: 'n0_m3',
    symbol: 'n_0',
    unit: 'm^-3',
    default: 1e18,
    min: 0,
    minExclusive: true,
    max: 1e32,
    meaning: 'Electron density on the axis.',
  },
  {
    name: 'Te0_eV',
    symbol: 'T_e0',
    unit: 'eV',
    default: 5,
    min: 0,
    minExclusive: true,
    max: 1e6,
    meaning: 'Electron temperature on the axis.',
  },
  {
    name: 'Ti0_eV',
    symbol: 'T_i0',
    unit: 'eV',
    default: 0.1,
    min: 0,
    minExclusive: true,
    max: 1e6,
    meaning: 'Ion temperature on the axis.',
  },
  {
    name: 'B0_T',
    symbol: 'B_0',
    unit: 'T',
    default: 0.2,
    min: 0,
    minExclusive: true,
    max: 100,
    meaning: 'Vacuum magnetic field along +z (outside the plasma).',
  },
  {
    name: 'a_m',
    symbol: 'a',
    unit: 'm',
    default: 0.05,
    min: 0,
    minExclusive: true,
    max: 1e12,
    meaning: 'Gaussian profile width: n = n0 exp(−r²/a²).',
  },
  {
    name: 'phi0_V',
    symbol: 'φ_0',
    unit: 'V',
    default: 0,
    min: -1e7,
    max: 1e7,
    meaning: 'Potential on the axis; the potential has the same Gaussian shape.',
  },
  {
    name: 'gamma_e',
    symbol: 'γ_e',
    unit: '1',
    default: 1,
    min: 0,
    minExclusive: true,
    max: 10,
    meaning: 'Electron polytropic index; T_e ∝ n^(γ_e−1).',
  },
  {
    name: 'gamma_i',
    symbol: 'γ_i',
    unit: '1',
    default: 1,
    min: 0,
    minExclusive: true,
    max: 10,
    meaning: 'Ion polytropic index; T_i ∝ n^(γ_i−1).',
  },
  {
    name: 'mu',
    symbol: 'μ',
    unit: '1',
    default: 39.66,
    min: 1,
    max: 500,
    meaning: 'Ion mass in proton masses m_i/m_p (argon 39.948 u = 39.6594 m_p; deuterium 2).',
  },
  { name: 'Z', symbol: 'Z', unit: '1', default: 1, min: 1, max: 100, meaning: 'Ion charge state; n_i = n_e/Z.' },
  {
    name: 'nr',
    symbol: 'N_r',
    unit: '1',
    default: 256,
    min: 16,
    max: 8192,
    integer: true,
    meaning: 'Number of radial grid nodes from the axis to rmax.',
  },
  {
    name: 'rmax_over_a',
    symbol: 'r_max/a',
    unit: '1',
    default: 3,
    min: 2,
    max: 20,
    meaning: 'Outer edge of the radial grid in units of a.',
  },
];

const outputs: OutputSpec[] = [
  {
    name: 'vDi_peak_ms',
    symbol: 'v_Di,pk',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Ion diamagnetic drift of largest magnitude over r ≤ 2a, r = 2a included (signed azimuthal).',
  },
  {
    name: 'vDe_peak_ms',
    symbol: 'v_De,pk',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Electron diamagnetic drift of largest magnitude over r ≤ 2a, r = 2a included (signed azimuthal).',
  },
  {
    name: 'vE_peak_ms',
    symbol: 'v_E,pk',
    unit: 'm/s',
    kind: 'number',
    meaning: 'E×B drift of largest magnitude over r ≤ 2a, r = 2a included (signed azimuthal).',
  },
  {
    name: 'r_peak_m',
    symbol: 'r_pk',
    unit: 'm',
    kind: 'number',
    meaning: 'Radius of the diamagnetic-current peak (within r ≤ 2a).',
  },
  {
    name: 'jTheta_peak_Am2',
    symbol: 'j_θ,pk',
    unit: 'A/m^2',
    kind: 'number',
    meaning: 'Diamagnetic current density at its peak, −|dp/dr|/B (signed azimuthal).',
  },
  {
    name: 'beta0',
    symbol: 'β_0',
    unit: '1',
    kind: 'number',
    meaning: 'Beta on the axis against the vacuum field, 2μ0 p(0)/B0².',
  },
  {
    name: 'dB_over_B_axis',
    symbol: 'ΔB/B_0',
    unit: '1',
    kind: 'number',
    meaning: 'Field change on the axis, B(0)/B0 − 1 = sqrt(1−β0) − 1 = −β0/(1 + sqrt(1−β0)) (−1 when β0 ≥ 1).',
  },
  {
    name: 'flux_Wb',
    symbol: 'ΔΦ',
    unit: 'Wb',
    kind: 'number',
    meaning: 'Diamagnetic flux ∫(B − B0) 2πr dr out to rmax (what a loop around the column sees).',
  },
  {
    name: 'Wperp_Jm',
    symbol: 'W_⊥',
    unit: 'J/m',
    kind: 'number',
    meaning: 'Thermal energy per unit length ∫p 2πr dr out to rmax.',
  },
  {
    name: 'max_rho_i_over_Ln',
    symbol: 'max ρ_i/L_n',
    unit: '1',
    kind: 'number',
    meaning: 'Largest ion gyroradius over local gradient length, r ≤ 2a.',
  },
  {
    name: 'max_rho_s_over_Ln',
    symbol: 'max ρ_s/L_n',
    unit: '1',
    kind: 'number',
    meaning: 'Largest sound gyroradius ρ_s = c_s0/ω_ci (c_s0 = sqrt(Z e T_e/m_i)) over local gradient length, r ≤ 2a.',
  },
  {
    name: 'max_lambdaD_over_Ln',
    symbol: 'max λ_D/L_n',
    unit: '1',
    kind: 'number',
    meaning: 'Largest Debye length over local gradient length, r ≤ 2a.',
  },
  {
    name: 'max_vDi_over_vti',
    symbol: 'max |v_Di|/v_ti',
    unit: '1',
    kind: 'number',
    meaning: 'Largest ion diamagnetic drift over ion thermal speed, r ≤ 2a.',
  },
  {
    name: 'vDi_a_ms',
    symbol: 'v_Di(a)',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Ion diamagnetic drift at r = a (signed azimuthal); well defined whatever the window.',
  },
  {
    name: 'vDe_a_ms',
    symbol: 'v_De(a)',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Electron diamagnetic drift at r = a (signed azimuthal).',
  },
  { name: 'vE_a_ms', symbol: 'v_E(a)', unit: 'm/s', kind: 'number', meaning: 'E×B drift at r = a (signed azimuthal).' },
  {
    name: 'integral_rel_error',
    symbol: 'ε_int',
    unit: '1',
    kind: 'number',
    meaning:
      'Estimated relative error of flux and W⊥: |I(N_r) − I(⌈N_r/2⌉)|/|I(N_r)|, the larger of the two (an upper estimate).',
  },
  { name: 'valid', symbol: 'valid', unit: '1', kind: 'boolean', meaning: 'True when no invalidating flag is raised.' },
];

const flags: FlagSpec[] = [
  {
    code: 'rho_i_over_Ln',
    ordering: { output: 'max_rho_i_over_Ln', threshold: 'rho_i_over_Ln_max' },
    bit: 0,
    invalidates: true,
    meaning:
      'Somewhere in r ≤ 2a the ion gyroradius is not small against the local gradient length (ρ_i/L_n ≥ threshold).',
  },
  {
    code: 'lambdaD_over_Ln',
    ordering: { output: 'max_lambdaD_over_Ln', threshold: 'lambdaD_over_Ln_max' },
    bit: 1,
    invalidates: true,
    meaning:
      'Somewhere in r ≤ 2a the Debye length is not small against the local gradient length (λ_D/L_n ≥ threshold).',
  },
  {
    code: 'beta',
    ordering: { output: 'beta0', threshold: 'beta_max' },
    bit: 2,
    invalidates: true,
    meaning:
      'Axis beta reaches the threshold (β0 ≥ 1: the field cannot confine the column; B is set to 0 where B² < 0).',
  },
  {
    code: 'rho_s_over_Ln',
    ordering: { output: 'max_rho_s_over_Ln', threshold: 'rho_s_over_Ln_max' },
    bit: 3,
    invalidates: true,
    meaning:
      'Somewhere in r ≤ 2a the ion sound gyroradius ρ_s is not small against the local gradient length (ρ_s/L_n ≥ threshold).',
  },
  {
    code: 'under_resolved',
    bit: 4,
    invalidates: true,
    meaning:
      'The radial integrals are not converged: halving the grid changes flux or W⊥ by more than the threshold (relative). Raise N_r.',
  },
  {
    code: 'peak_at_window_edge',
    bit: 5,
    invalidates: false,
    meaning:
      'A drift or current "peak" lies at the window edge r = 2a: the quantity still grows there, so the peak measures the window, not the column (see the values at r = a).',
  },
];

const thresholds: ThresholdSpec[] = [
  {
    name: 'rho_i_over_Ln_max',
    default: 0.1,
    meaning: 'Flag rho_i_over_Ln when max ρ_i/L_n ≥ this (0.1 is common practice).',
  },
  {
    name: 'lambdaD_over_Ln_max',
    default: 0.1,
    meaning: 'Flag lambdaD_over_Ln when max λ_D/L_n ≥ this (0.1 is common practice).',
  },
  { name: 'beta_max', default: 1, meaning: 'Flag beta when β0 ≥ this.' },
  {
    name: 'rho_s_over_Ln_max',
    default: 0.1,
    meaning: 'Flag rho_s_over_Ln when max ρ_s/L_n ≥ this (0.1 is common practice).',
  },
  {
    name: 'integral_rel_error_max',
    default: 1e-4,
    meaning: 'Flag under_resolved when the estimated relative error of the integrals exceeds this.',
  },
];

const INPUT_NAMES = inputs.map((i) => i.name);
const INVALID_MASK = invalidatingMask(flags);
const E = ELEMENTARY_CHARGE;
const MU0 = VACUUM_PERMEABILITY;
const MP_OVER_E = PROTON_MASS / ELEMENTARY_CHARGE;
const EPS0_OVER_E = VACUUM_PERMITTIVITY / ELEMENTARY_CHARGE;

/** Scalars of one point, in output order (without `valid`). */
const S = {
  vDi: 0,
  vDe: 1,
  vE: 2,
  rPeak: 3,
  jPeak: 4,
  beta0: 5,
  dBaxis: 6,
  flux: 7,
  wperp: 8,
  rhoI: 9,
  rhoS: 10,
  lD: 11,
  vDiVti: 12,
  vDiA: 13,
  vDeA: 14,
  vEA: 15,
  intErr: 16,
  mask: 17,
  count: 18,
} as const;

interface ProfileArrays {
  r_m: number[];
  n_m3: number[];
  p_Pa: number[];
  Te_eV: number[];
  Ti_eV: number[];
  phi_V: number[];
  Er_Vm: number[];
  vDe_ms: number[];
  vDi_ms: number[];
  vE_ms: number[];
  jTheta_Am2: number[];
  B_T: number[];
}

/** Parameters of the point being integrated, set once per point (no allocation per point). */
const P = {
  te0: 0,
  ti0: 0,
  pe0: 0,
  pi0: 0,
  b02: 0,
  b0: 0,
  invA2: 0,
  ge: 1,
  gi: 1,
  phi0: 0,
  z: 1,
  miOverE: 0,
  sqrtMiOverE: 0,
  ld0: 0,
};

/** Local values at one radius (written by `local`). */
const L = {
  p: 0,
  b: 0,
  dB: 0,
  dpdr: 0,
  teR: 0,
  tiR: 0,
  er: 0,
  vde: 0,
  vdi: 0,
  ve: 0,
  j: 0,
  rhoI: 0,
  rhoS: 0,
  ld: 0,
  xGe: 0,
};

/** Pressure and field at radius r (what the integrals need); returns exp(−r²/a²). */
function pressureAndField(r: number): number {
  const s = r * r * P.invA2;
  const eS = Math.exp(-s);
  // exp(−γ s); γ = 1 reuses exp(−s).
  const xGe = P.ge === 1 ? eS : Math.exp(-P.ge * s);
  const xGi = P.gi === 1 ? eS : Math.exp(-P.gi * s);
  const pe = P.pe0 * xGe;
  const pi = P.pi0 * xGi;
  const p = pe + pi;
  const b2 = P.b02 - 2 * MU0 * p;
  const b = b2 > 0 ? Math.sqrt(b2) : 0;
  L.p = p;
  L.b = b;
  // B − B0 = −2μ0 p/(B + B0): no cancellation at low β.
  L.dB = b2 > 0 ? (-2 * MU0 * p) / (b + P.b0) : -P.b0;
  const invLn = 2 * r * P.invA2;
  L.dpdr = -invLn * (P.ge * pe + P.gi * pi);
  // T(r) = T0 exp((1−γ)s) = T0 exp(−γs)/exp(−s); no underflow for s ≤ 4 (core) and γ ≤ 10.
  L.teR = (P.te0 * xGe) / eS;
  L.tiR = (P.ti0 * xGi) / eS;
  L.xGe = xGe;
  return eS;
}

/** Drifts, current and ordering parameters at r after `pressureAndField(r)` returned eS. */
function drifts(r: number, eS: number): void {
  const invLn = 2 * r * P.invA2;
  const invB = 1 / L.b;
  const invZ = 1 / P.z;
  L.vde = P.ge * L.teR * invLn * invB;
  L.vdi = -P.gi * L.tiR * invLn * invB * invZ;
  L.er = P.phi0 * invLn * eS;
  L.ve = -L.er * invB;
  L.j = L.dpdr * invB;
  // ρ_i = sqrt(T_i m_i/e)/(Z B); drift-wave ρ_s = c_s0/ω_ci = sqrt(Z T_e m_i/e)/(Z B).
  L.rhoI = P.sqrtMiOverE * Math.sqrt(L.tiR) * invZ * invB * invLn;
  L.rhoS = Math.sqrt(P.z * L.teR * P.miOverE) * invZ * invB * invLn;
  // λ_D ∝ sqrt(T/n) = exp((2−γ_e)s/2) = sqrt(exp(−γ_e s))/exp(−s).
  L.ld = ((P.ld0 * Math.sqrt(L.xGe)) / eS) * invLn;
}

/**
 * End-corrected trapezoid sums of g = 2πr(B − B0) and g = 2πr p on a uniform grid, fed node by
 * node after `pressureAndField(r)`; `finish` adds the Euler–Maclaurin correction −h²/12·[g′]₀^R.
 */
class Trapezoid {
  private sumF = 0;
  private sumW = 0;
  private gFPrev = 0;
  private gWPrev = 0;
  private dgF0 = 0;
  private dgW0 = 0;
  flux = 0;
  w = 0;
  reset(): void {
    this.sumF = this.sumW = this.gFPrev = this.gWPrev = this.dgF0 = this.dgW0 = 0;
  }
  /** Node at r (the first node is r = 0). */
  add(r: number, first: boolean): void {
    const gF = 2 * Math.PI * r * L.dB;
    const gW = 2 * Math.PI * r * L.p;
    if (first) {
      this.dgF0 = 2 * Math.PI * L.dB;
      this.dgW0 = 2 * Math.PI * L.p;
    } else {
      this.sumF += 0.5 * (gF + this.gFPrev);
      this.sumW += 0.5 * (gW + this.gWPrev);
    }
    this.gFPrev = gF;
    this.gWPrev = gW;
  }
  /** After the last node (at r, still in L): the corrected integrals with step h. */
  finish(r: number, h: number): void {
    // g′ = 2π(f + r f′); dB/dr = −μ0 (dp/dr)/B from B dB/dr = −μ0 dp/dr.
    const dgWEnd = 2 * Math.PI * (L.p + r * L.dpdr);
    const dgFEnd = L.b > 0 ? 2 * Math.PI * (L.dB + (r * -MU0 * L.dpdr) / L.b) : NaN;
    const corr = (h * h) / 12;
    this.flux = h * this.sumF - (Number.isFinite(dgFEnd) ? corr * (dgFEnd - this.dgF0) : 0);
    this.w = h * this.sumW - corr * (dgWEnd - this.dgW0);
  }
}
const fine = new Trapezoid();
const coarse = new Trapezoid();

interface Limits {
  rhoI: number;
  ld: number;
  beta: number;
  rhoS: number;
  intErr: number;
}
const NO_LIMITS: Limits = { rhoI: Infinity, ld: Infinity, beta: Infinity, rhoS: Infinity, intErr: Infinity };

/**
 * One point: integrates over the grid and writes the scalars into `res`. No allocation unless
 * `prof` is given (the single-point page's plot arrays).
 */
function kernel(
  n0: number,
  te0: number,
  ti0: number,
  b0: number,
  a: number,
  phi0: number,
  ge: number,
  gi: number,
  mu: number,
  z: number,
  nrIn: number,
  rmaxA: number,
  lim: Limits,
  res: Float64Array,
  prof: ProfileArrays | null,
): void {
  const nr = Math.max(2, Math.round(nrIn));
  const rmax = rmaxA * a;
  const h = rmax / (nr - 1);
  P.te0 = te0;
  P.ti0 = ti0;
  P.pe0 = n0 * E * te0;
  P.pi0 = (n0 / z) * E * ti0;
  P.b0 = b0;
  P.b02 = b0 * b0;
  P.invA2 = 1 / (a * a);
  P.ge = ge;
  P.gi = gi;
  P.phi0 = phi0;
  P.z = z;
  P.miOverE = MP_OVER_E * mu; // m_i/e
  P.sqrtMiOverE = Math.sqrt(P.miOverE);
  P.ld0 = Math.sqrt((EPS0_OVER_E * te0) / n0);
  const rEdge = 2 * a;
  // Nodes strictly inside the window r < 2a (tolerance: a node at 2a is the edge, evaluated below).
  const iCore = Math.min(nr - 1, Math.ceil(rEdge / h - 1e-9) - 1);

  let vDiPk = 0,
    vDePk = 0,
    vEPk = 0,
    jPk = 0,
    rPk = 0;
  let rhoIMax = 0,
    rhoSMax = 0,
    ldMaxV = 0,
    vDiVtiMax = 0;

  // Coarse grid for the error estimate: ⌈nr/2⌉ nodes. For odd nr they are the even fine nodes
  // (accumulated in the same pass); for even nr a second, half-length pass follows.
  const mCoarse = Math.max(2, Math.ceil(nr / 2));
  const coarseInline = nr % 2 === 1;
  fine.reset();
  coarse.reset();
  for (let i = 0; i < nr; i++) {
    const r = i * h;
    const eS = pressureAndField(r);
    fine.add(r, i === 0);
    if (coarseInline && i % 2 === 0) coarse.add(r, i === 0);
    if (i === nr - 1) {
      fine.finish(r, h);
      if (coarseInline) coarse.finish(r, 2 * h);
    }
    if (i > iCore && !prof) continue;
    drifts(r, eS);
    if (prof) {
      prof.r_m.push(r);
      prof.n_m3.push(n0 * eS);
      prof.p_Pa.push(L.p);
      prof.Te_eV.push(L.teR);
      prof.Ti_eV.push(L.tiR);
      prof.phi_V.push(phi0 * eS);
      prof.Er_Vm.push(L.er);
      prof.vDe_ms.push(L.vde);
      prof.vDi_ms.push(L.vdi);
      prof.vE_ms.push(L.ve);
      prof.jTheta_Am2.push(L.j);
      prof.B_T.push(L.b);
    }
    if (i > iCore) continue;
    if (Math.abs(L.vdi) > Math.abs(vDiPk)) vDiPk = L.vdi;
    if (Math.abs(L.vde) > Math.abs(vDePk)) vDePk = L.vde;
    if (Math.abs(L.ve) > Math.abs(vEPk)) vEPk = L.ve;
    if (Math.abs(L.j) > Math.abs(jPk)) {
      jPk = L.j;
      rPk = r;
    }
    // `!(x <= max)` keeps NaN visible in the maximum.
    if (!(L.rhoI <= rhoIMax)) rhoIMax = L.rhoI;
    if (!(L.rhoS <= rhoSMax)) rhoSMax = L.rhoS;
    if (!(L.ld <= ldMaxV)) ldMaxV = L.ld;
    const vv = gi * L.rhoI;
    if (!(vv <= vDiVtiMax)) vDiVtiMax = vv;
  }
  if (!coarseInline) {
    const hc = rmax / (mCoarse - 1);
    for (let i = 0; i < mCoarse; i++) {
      const r = i * hc;
      pressureAndField(r);
      coarse.add(r, i === 0);
      if (i === mCoarse - 1) coarse.finish(r, hc);
    }
  }

  // The window edge r = 2a itself. A peak that is largest there (strictly) sits at the edge.
  let edge = false;
  drifts(rEdge, pressureAndField(rEdge));
  if (Math.abs(L.vdi) > Math.abs(vDiPk)) {
    vDiPk = L.vdi;
    edge = true;
  }
  if (Math.abs(L.vde) > Math.abs(vDePk)) {
    vDePk = L.vde;
    edge = true;
  }
  if (Math.abs(L.ve) > Math.abs(vEPk)) {
    vEPk = L.ve;
    edge = true;
  }
  if (Math.abs(L.j) > Math.abs(jPk)) {
    jPk = L.j;
    rPk = rEdge;
    edge = true;
  }
  if (!(L.rhoI <= rhoIMax)) rhoIMax = L.rhoI;
  if (!(L.rhoS <= rhoSMax)) rhoSMax = L.rhoS;
  if (!(L.ld <= ldMaxV)) ldMaxV = L.ld;
  if (!(gi * L.rhoI <= vDiVtiMax)) vDiVtiMax = gi * L.rhoI;

  // Drifts at r = a.
  drifts(a, pressureAndField(a));
  res[S.vDiA] = L.vdi;
  res[S.vDeA] = L.vde;
  res[S.vEA] = L.ve;

  const flux = fine.flux;
  const wperp = fine.w;
  const errW = Math.abs(wperp - coarse.w) / Math.abs(wperp);
  const errF = Math.abs(flux - coarse.flux) / Math.abs(flux);
  // The flux is undefined (NaN) where B² < 0 at the edge, which the beta flag reports.
  const intErr = Number.isFinite(errF) && errF > errW ? errF : errW;

  const beta0 = (2 * MU0 * (P.pe0 + P.pi0)) / P.b02;
  res[S.vDi] = vDiPk;
  res[S.vDe] = vDePk;
  res[S.vE] = vEPk;
  res[S.rPeak] = rPk;
  res[S.jPeak] = jPk;
  res[S.beta0] = beta0;
  res[S.dBaxis] = fieldDepression(beta0);
  res[S.flux] = flux;
  res[S.wperp] = wperp;
  res[S.rhoI] = rhoIMax;
  res[S.rhoS] = rhoSMax;
  res[S.lD] = ldMaxV;
  res[S.vDiVti] = vDiVtiMax;
  res[S.intErr] = intErr;
  let mask = 0;
  if (!(rhoIMax < lim.rhoI)) mask |= 1;
  if (!(ldMaxV < lim.ld)) mask |= 2;
  if (!(beta0 < lim.beta)) mask |= 4;
  if (!(rhoSMax < lim.rhoS)) mask |= 8;
  if (!(intErr <= lim.intErr)) mask |= 16;
  if (edge) mask |= 32;
  res[S.mask] = mask;
}

const scratch = new Float64Array(S.count);
const limits: Limits = { ...NO_LIMITS };

function evaluateChunk(inp: Record<string, Float64Array>, n: number, out: ChunkOutput, th?: Thresholds): void {
  const [n0c, tec, tic, b0c, ac, phic, gec, gic, muc, zc, nrc, rmc] = inputColumns(
    INPUT_NAMES,
    inp,
    n,
  ) as Float64Array[] as [
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
  const cols = outputColumns(outputs, out, n);
  const valid = cols[cols.length - 1]!;
  limits.rhoI = thresholdValue(thresholds, th, 'rho_i_over_Ln_max');
  limits.ld = thresholdValue(thresholds, th, 'lambdaD_over_Ln_max');
  limits.beta = thresholdValue(thresholds, th, 'beta_max');
  limits.rhoS = thresholdValue(thresholds, th, 'rho_s_over_Ln_max');
  limits.intErr = thresholdValue(thresholds, th, 'integral_rel_error_max');
  const res = scratch;
  for (let k = 0; k < n; k++) {
    kernel(
      n0c[k]!,
      tec[k]!,
      tic[k]!,
      b0c[k]!,
      ac[k]!,
      phic[k]!,
      gec[k]!,
      gic[k]!,
      muc[k]!,
      zc[k]!,
      nrc[k]!,
      rmc[k]!,
      limits,
      res,
      null,
    );
    for (let c = 0; c < S.mask; c++) cols[c]![k] = res[c]!;
    const mask = res[S.mask]!;
    out.flags[k] = mask;
    valid[k] = mask & INVALID_MASK ? 0 : 1;
  }
}

function profile(v: Record<string, number>): Profile {
  const prof: ProfileArrays = {
    r_m: [],
    n_m3: [],
    p_Pa: [],
    Te_eV: [],
    Ti_eV: [],
    phi_V: [],
    Er_Vm: [],
    vDe_ms: [],
    vDi_ms: [],
    vE_ms: [],
    jTheta_Am2: [],
    B_T: [],
  };
  const d = (name: string) => v[name] ?? inputs.find((i) => i.name === name)!.default;
  kernel(
    d('n0_m3'),
    d('Te0_eV'),
    d('Ti0_eV'),
    d('B0_T'),
    d('a_m'),
    d('phi0_V'),
    d('gamma_e'),
    d('gamma_i'),
    d('mu'),
    d('Z'),
    d('nr'),
    d('rmax_over_a'),
    NO_LIMITS,
    new Float64Array(S.count),
    prof,
  );
  return { ...prof };
}

const orderings = [
  { output: 'max_rho_i_over_Ln', threshold: 'rho_i_over_Ln_max' },
  { output: 'max_rho_s_over_Ln', threshold: 'rho_s_over_Ln_max' },
  { output: 'max_lambdaD_over_Ln', threshold: 'lambdaD_over_Ln_max' },
  { output: 'beta0', threshold: 'beta_max' },
  { output: 'integral_rel_error', threshold: 'integral_rel_error_max' },
  { output: 'max_vDi_over_vti', threshold: null },
];

export const columnProfile: ModelDefinition = {
  id: 'column-profile',
  version: '1.1.0',
  title: 'Gaussian column profile',
  summary:
    'Radial profiles of a Gaussian plasma column: peak drifts and diamagnetic current, axis beta and field depression, diamagnetic flux and stored energy, ordering maxima in the core.',
  inputs,
  outputs,
  flags,
  thresholds,
  orderings,
  evaluate(values, th) {
    return evaluateViaChunk(columnProfile, values, th);
  },
  evaluateChunk,
  profile,
};
