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
 * measure rmax).
 */
import { ELEMENTARY_CHARGE, PROTON_MASS, VACUUM_PERMEABILITY, VACUUM_PERMITTIVITY } from '../constants.js';
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
    meaning: 'Ion mass in proton masses m_i/m_p (argon 39.66, i.e. 39.948 u; deuterium 2).',
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
    meaning: 'Ion diamagnetic drift of largest magnitude over r ≤ 2a (signed azimuthal).',
  },
  {
    name: 'vDe_peak_ms',
    symbol: 'v_De,pk',
    unit: 'm/s',
    kind: 'number',
    meaning: 'Electron diamagnetic drift of largest magnitude over r ≤ 2a (signed azimuthal).',
  },
  {
    name: 'vE_peak_ms',
    symbol: 'v_E,pk',
    unit: 'm/s',
    kind: 'number',
    meaning: 'E×B drift of largest magnitude over r ≤ 2a (signed azimuthal).',
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
    meaning: 'Field change on the axis, B(0)/B0 − 1 = sqrt(1−β0) − 1 (−1 when β0 ≥ 1).',
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
    meaning: 'Largest sound gyroradius over local gradient length, r ≤ 2a.',
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
  { name: 'valid', symbol: 'valid', unit: '1', kind: 'boolean', meaning: 'True when no validity flag is raised.' },
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
  mask: 13,
  count: 14,
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
  rhoMax: number,
  ldMax: number,
  betaMax: number,
  res: Float64Array,
  prof: ProfileArrays | null,
): void {
  const nr = Math.max(2, Math.round(nrIn));
  const rmax = rmaxA * a;
  const h = rmax / (nr - 1);
  const invA2 = 1 / (a * a);
  const pe0 = n0 * E * te0;
  const pi0 = (n0 / z) * E * ti0;
  const b02 = b0 * b0;
  const twoMu0 = 2 * MU0;
  const miOverE = MP_OVER_E * mu; // m_i/e
  const sqrtMiOverE = Math.sqrt(miOverE);
  const invZ = 1 / z;
  const ld0 = Math.sqrt((EPS0_OVER_E * te0) / n0);
  // Last node of the core r ≤ 2a (tolerance so that 2a on the grid counts).
  const iCore = Math.min(nr - 1, Math.floor((2 * a) / h + 1e-9));

  let vDiPk = 0,
    vDePk = 0,
    vEPk = 0,
    jPk = 0,
    rPk = 0;
  let rhoIMax = 0,
    rhoSMax = 0,
    ldMaxV = 0,
    vDiVtiMax = 0;
  let sumFlux = 0,
    sumW = 0;
  let gFluxPrev = 0,
    gWPrev = 0;
  let dgFlux0 = 0,
    dgW0 = 0,
    dgFluxEnd = 0,
    dgWEnd = 0;

  for (let i = 0; i < nr; i++) {
    const r = i * h;
    const s = r * r * invA2;
    const eS = Math.exp(-s);
    // exp(−γ s), shared with the local temperatures below; γ = 1 reuses exp(−s).
    const xGe = ge === 1 ? eS : Math.exp(-ge * s);
    const xGi = gi === 1 ? eS : Math.exp(-gi * s);
    const pe = pe0 * xGe;
    const pi = pi0 * xGi;
    const p = pe + pi;
    const b2 = b02 - twoMu0 * p;
    const b = b2 > 0 ? Math.sqrt(b2) : 0;
    const dB = b2 > 0 ? (-twoMu0 * p) / (b + b0) : -b0;
    const invLn = 2 * r * invA2;
    const dpdr = -invLn * (ge * pe + gi * pi);

    // Integrands g = 2πr f; trapezoid sums with weight 1/2 at both ends (applied after the loop).
    const gFlux = 2 * Math.PI * r * dB;
    const gW = 2 * Math.PI * r * p;
    if (i === 0) {
      dgFlux0 = 2 * Math.PI * dB;
      dgW0 = 2 * Math.PI * p;
    } else {
      sumFlux += 0.5 * (gFlux + gFluxPrev);
      sumW += 0.5 * (gW + gWPrev);
    }
    gFluxPrev = gFlux;
    gWPrev = gW;
    if (i === nr - 1) {
      // g′ = 2π(f + r f′); dB/dr = −μ0 (dp/dr)/B from B dB/dr = −μ0 dp/dr.
      dgWEnd = 2 * Math.PI * (p + r * dpdr);
      dgFluxEnd = b > 0 ? 2 * Math.PI * (dB + (r * -MU0 * dpdr) / b) : NaN;
    }

    if (i <= iCore || prof) {
      const invB = 1 / b;
      // T(r) = T0 exp((1−γ)s) = T0 exp(−γs)/exp(−s); no underflow for s ≤ 4 (core) and γ ≤ 10,
      // and the profile arrays beyond the core tolerate it.
      const teR = (te0 * xGe) / eS;
      const tiR = (ti0 * xGi) / eS;
      const vde = ge * teR * invLn * invB;
      const vdi = -gi * tiR * invLn * invB * invZ;
      const er = phi0 * invLn * eS;
      const ve = -er * invB;
      const j = dpdr * invB;
      if (prof) {
        prof.r_m.push(r);
        prof.n_m3.push(n0 * eS);
        prof.p_Pa.push(p);
        prof.Te_eV.push(teR);
        prof.Ti_eV.push(tiR);
        prof.phi_V.push(phi0 * eS);
        prof.Er_Vm.push(er);
        prof.vDe_ms.push(vde);
        prof.vDi_ms.push(vdi);
        prof.vE_ms.push(ve);
        prof.jTheta_Am2.push(j);
        prof.B_T.push(b);
      }
      if (i <= iCore) {
        if (Math.abs(vdi) > Math.abs(vDiPk)) vDiPk = vdi;
        if (Math.abs(vde) > Math.abs(vDePk)) vDePk = vde;
        if (Math.abs(ve) > Math.abs(vEPk)) vEPk = ve;
        if (Math.abs(j) > Math.abs(jPk)) {
          jPk = j;
          rPk = r;
        }
        // ρ_i = sqrt(T_i m_i/e)/(Z B); ρ_s = c_s m_i/(Z e B) with c_s² = (Z γ_e T_e + γ_i T_i) e/m_i.
        const rhoI = sqrtMiOverE * Math.sqrt(tiR) * invZ * invB * invLn;
        const rhoS = Math.sqrt((z * ge * teR + gi * tiR) * miOverE) * invZ * invB * invLn;
        const ld = ((ld0 * Math.sqrt(xGe)) / eS) * invLn; // λ_D ∝ sqrt(T/n) = exp((2−γ_e)s/2)
        const vv = gi * rhoI;
        // `!(x <= max)` keeps NaN visible in the maximum.
        if (!(rhoI <= rhoIMax)) rhoIMax = rhoI;
        if (!(rhoS <= rhoSMax)) rhoSMax = rhoS;
        if (!(ld <= ldMaxV)) ldMaxV = ld;
        if (!(vv <= vDiVtiMax)) vDiVtiMax = vv;
      }
    }
  }
  // Trapezoid: the loop summed full interval averages; add the Euler–Maclaurin end correction.
  const corr = (h * h) / 12;
  const flux = h * sumFlux - (Number.isFinite(dgFluxEnd) ? corr * (dgFluxEnd - dgFlux0) : 0);
  const wperp = h * sumW - corr * (dgWEnd - dgW0);

  const beta0 = (twoMu0 * (pe0 + pi0)) / b02;
  res[S.vDi] = vDiPk;
  res[S.vDe] = vDePk;
  res[S.vE] = vEPk;
  res[S.rPeak] = rPk;
  res[S.jPeak] = jPk;
  res[S.beta0] = beta0;
  res[S.dBaxis] = beta0 < 1 ? Math.sqrt(1 - beta0) - 1 : -1;
  res[S.flux] = flux;
  res[S.wperp] = wperp;
  res[S.rhoI] = rhoIMax;
  res[S.rhoS] = rhoSMax;
  res[S.lD] = ldMaxV;
  res[S.vDiVti] = vDiVtiMax;
  let mask = 0;
  if (!(rhoIMax < rhoMax)) mask |= 1;
  if (!(ldMaxV < ldMax)) mask |= 2;
  if (!(beta0 < betaMax)) mask |= 4;
  res[S.mask] = mask;
}

const scratch = new Float64Array(S.count);

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
  const rhoMax = thresholdValue(thresholds, th, 'rho_i_over_Ln_max');
  const ldMax = thresholdValue(thresholds, th, 'lambdaD_over_Ln_max');
  const betaMax = thresholdValue(thresholds, th, 'beta_max');
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
      rhoMax,
      ldMax,
      betaMax,
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
    Infinity,
    Infinity,
    Infinity,
    new Float64Array(S.count),
    prof,
  );
  return { ...prof };
}

export const columnProfile: ModelDefinition = {
  id: 'column-profile',
  version: '1.0.0',
  title: 'Gaussian column profile',
  summary:
    'Radial profiles of a Gaussian plasma column: peak drifts and diamagnetic current, axis beta and field depression, diamagnetic flux and stored energy, ordering maxima in the core.',
  inputs,
  outputs,
  flags,
  thresholds,
  evaluate(values, th) {
    return evaluateViaChunk(columnProfile, values, th);
  },
  evaluateChunk,
  profile,
};
