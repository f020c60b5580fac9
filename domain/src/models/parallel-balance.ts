/**
 * `parallel-balance` (SPEC §3.2): electron force balance along B without inertia or parallel flow.
 *
 * With q = −e, e n ∇φ = ∇p and p ∝ n^γ:
 *   n/n0 = [1 + ((γ−1)/γ) φ/T0]^(1/(γ−1)),   T/T0 = (n/n0)^(γ−1),
 * which tends to the Boltzmann relation exp(φ/T0) as γ → 1. γ = 1 is evaluated with the
 * exponential exactly. Near γ = 1 the power is computed as exp(log1p(a)/(γ−1)) so that no digits
 * are lost when (γ−1)/γ·φ/T0 is tiny (the naive pow form loses ~1e-9 relative at |γ−1| = 1e-7).
 *
 * The departure from Boltzmann, δ = (n/n0)/exp(φ/T0) − 1, is O(γ−1) while both ratios are O(1):
 * dividing them loses ε/|γ−1| relative (1e-7 at γ − 1 = 1e-9). Version 1.1 writes it as
 *   δ = expm1( (log1p(a) − a)/(γ−1) − a ),  a = ((γ−1)/γ) φ/T0,
 * (exact algebra: log1p(a)/(γ−1) − φ/T0 = (log1p(a) − a)/(γ−1) + a/(γ−1) − φ/T0 and
 * a/(γ−1) − φ/T0 = −a), with log1p(a) − a from a cancellation-free series for small |a|.
 * A density ratio that overflows a double is flagged (`overflow`), never reported valid.
 */
import { ELECTRON_MASS, ELEMENTARY_CHARGE, PROTON_MASS, VACUUM_PERMITTIVITY } from '../constants.js';
import { evaluateViaChunk, inputColumns, invalidatingMask, outputColumns } from './common.js';
import type { ChunkOutput, FlagSpec, InputSpec, ModelDefinition, OutputSpec, ThresholdSpec } from './types.js';

const inputs: InputSpec[] = [
  {
    name: 'Te_eV',
    symbol: 'T_0',
    unit: 'eV',
    default: 5,
    min: 0,
    minExclusive: true,
    max: 1e6,
    meaning: 'Electron temperature T0 at the reference point where n = n0.',
  },
  {
    name: 'n0_m3',
    symbol: 'n_0',
    unit: 'm^-3',
    default: 1e18,
    min: 0,
    minExclusive: true,
    max: 1e32,
    meaning: 'Electron density at the reference point.',
  },
  {
    name: 'phi_V',
    symbol: 'φ',
    unit: 'V',
    default: -5,
    min: -1e7,
    max: 1e7,
    meaning: 'Electrostatic potential relative to the reference point.',
  },
  {
    name: 'gamma_e',
    symbol: 'γ_e',
    unit: '1',
    default: 1,
    min: 0,
    minExclusive: true,
    max: 10,
    meaning: 'Electron polytropic index (1 gives the Boltzmann relation).',
  },
  {
    name: 'Lpar_m',
    symbol: 'L_∥',
    unit: 'm',
    default: 1,
    min: 0,
    minExclusive: true,
    max: 1e15,
    meaning: 'Parallel density gradient length n/|∇_∥ n|.',
  },
  {
    name: 'mu',
    symbol: 'μ',
    unit: '1',
    default: 1,
    min: 1,
    max: 500,
    meaning: 'Ion mass in proton masses, for the sheath edge and wall potential (hydrogen 1, argon 39.66).',
  },
];

const outputs: OutputSpec[] = [
  {
    name: 'n_over_n0',
    symbol: 'n/n_0',
    unit: '1',
    kind: 'number',
    meaning: 'Electron density relative to the reference (0 beyond the cutoff for γ > 1).',
  },
  { name: 'n_m3', symbol: 'n', unit: 'm^-3', kind: 'number', meaning: 'Electron density at potential φ.' },
  {
    name: 'T_over_T0',
    symbol: 'T/T_0',
    unit: '1',
    kind: 'number',
    meaning: 'Local electron temperature relative to T0, (n/n0)^(γ−1).',
  },
  {
    name: 'p_over_p0',
    symbol: 'p/p_0',
    unit: '1',
    kind: 'number',
    meaning: 'Local electron pressure relative to the reference, (n/n0)^γ.',
  },
  {
    name: 'boltzmann_n_over_n0',
    symbol: 'exp(φ/T_0)',
    unit: '1',
    kind: 'number',
    meaning: 'Isothermal Boltzmann density ratio exp(φ/T0), for comparison.',
  },
  {
    name: 'deviation',
    symbol: 'δ',
    unit: '1',
    kind: 'number',
    meaning:
      'Relative departure from the Boltzmann relation, (n/n0)/exp(φ/T0) − 1, computed without cancellation near γ = 1.',
  },
  {
    name: 'Epar_Vm',
    symbol: 'E_∥',
    unit: 'V/m',
    kind: 'number',
    meaning: 'Parallel field magnitude holding the electrons against the gradient, γ T_local/L_∥.',
  },
  {
    name: 'phi_cutoff_V',
    symbol: 'φ_c',
    unit: 'V',
    kind: 'number',
    meaning: 'Potential where the density reaches zero, −γ T0/(γ−1), for γ > 1 (NaN otherwise: no cutoff).',
  },
  {
    name: 'lambdaD_m',
    symbol: 'λ_D',
    unit: 'm',
    kind: 'number',
    meaning: 'Local electron Debye length sqrt(ε0 T_local/(e n)) (NaN beyond the cutoff).',
  },
  {
    name: 'sheathEdge_n_over_n0',
    symbol: 'n_s/n_0',
    unit: '1',
    kind: 'number',
    meaning: 'Density at the sheath edge for cold ions, (2/(γ+1))^(1/(γ−1)); e^(−1/2) at γ = 1.',
  },
  {
    name: 'presheath_V',
    symbol: 'φ_s',
    unit: 'V',
    kind: 'number',
    meaning: 'Presheath potential drop to the sheath edge, −γ T0/(γ+1).',
  },
  {
    name: 'floating_V',
    symbol: 'φ_f',
    unit: 'V',
    kind: 'number',
    meaning: 'Floating-wall potential relative to the bulk for γ = 1, −(T0/2)[1 + ln(m_i/(2π m_e))] (NaN for γ ≠ 1).',
  },
  { name: 'valid', symbol: 'valid', unit: '1', kind: 'boolean', meaning: 'True when no validity flag is raised.' },
];

const flags: FlagSpec[] = [
  {
    code: 'cutoff',
    bit: 0,
    invalidates: true,
    meaning:
      'The potential lies beyond the polytropic cutoff: for γ > 1 no electrons reach it (n = 0); for γ < 1 the relation has no real solution.',
  },
  {
    code: 'overflow',
    bit: 1,
    invalidates: true,
    meaning:
      'The density ratio n/n0 (or n) exceeds the largest double (φ/T0 ≳ 709 for γ = 1): the relation gives no usable density there.',
  },
];

const thresholds: ThresholdSpec[] = [];

const INPUT_NAMES = inputs.map((i) => i.name);
const INVALID_MASK = invalidatingMask(flags);
const EPS0_OVER_E = VACUUM_PERMITTIVITY / ELEMENTARY_CHARGE;
/** ln(m_p/(2π m_e)); ln(m_i/(2π m_e)) = this + ln(μ). */
const LN_MP_OVER_2PI_ME = Math.log(PROTON_MASS / (2 * Math.PI * ELECTRON_MASS));
const EXP_MINUS_HALF = Math.exp(-0.5);

/**
 * log1p(a) − a without cancellation. For |a| < 0.5 through u = a/(2 + a), log1p(a) = 2 atanh(u):
 * log1p(a) − a = 2Σ_{k≥1} u^(2k+1)/(2k+1) − 2u²/(1 − u) (both terms exact in sign, |u| < 1/3).
 */
export function log1pMinusX(a: number): number {
  if (!(Math.abs(a) < 0.5)) return Math.log1p(a) - a;
  const u = a / (2 + a);
  const u2 = u * u;
  let term = u * u2;
  let sum = 0;
  for (let k = 3; k < 80; k += 2) {
    const t = term / k;
    sum += t;
    if (Math.abs(t) <= 1e-17 * Math.abs(sum)) break;
    term *= u2;
  }
  return 2 * sum - (2 * u2) / (1 - u);
}

function evaluateChunk(inp: Record<string, Float64Array>, n: number, out: ChunkOutput): void {
  const [Tc, n0c, phic, gc, Lc, muc] = inputColumns(INPUT_NAMES, inp, n) as [
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
    Float64Array,
  ];
  const [nRel, nAbs, tRel, pRel, boltz, dev, epar, cutoff, lD, sheath, presheath, floating, valid] = outputColumns(
    outputs,
    out,
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
    Float64Array,
  ];
  const fl = out.flags;

  for (let k = 0; k < n; k++) {
    const t0 = Tc[k]!,
      n0 = n0c[k]!,
      phi = phic[k]!,
      g = gc[k]!,
      lpar = Lc[k]!,
      mu = muc[k]!;
    const x = phi / t0;
    const bz = Math.exp(x);
    let nr: number,
      tr: number,
      mask = 0;
    if (g === 1) {
      nr = bz;
      tr = 1;
      dev[k] = 0;
      sheath[k] = EXP_MINUS_HALF;
      cutoff[k] = NaN;
      floating[k] = -0.5 * t0 * (1 + LN_MP_OVER_2PI_ME + Math.log(mu));
    } else {
      const gm1 = g - 1;
      const a = (gm1 / g) * x;
      // 1 + a is T/T0; at or below zero the potential is past the cutoff.
      if (a > -1) {
        nr = Math.exp(Math.log1p(a) / gm1);
        tr = 1 + a;
        dev[k] = Math.expm1(log1pMinusX(a) / gm1 - a);
      } else {
        mask |= 1;
        nr = g > 1 ? 0 : NaN;
        tr = g > 1 ? 0 : NaN;
        dev[k] = nr / bz - 1;
      }
      sheath[k] = Math.exp(-Math.log1p(gm1 / 2) / gm1);
      cutoff[k] = g > 1 ? (-g * t0) / gm1 : NaN;
      floating[k] = NaN;
    }
    const nabs = n0 * nr;
    if (nabs === Infinity) mask |= 2;
    nRel[k] = nr;
    nAbs[k] = nabs;
    tRel[k] = tr;
    pRel[k] = nr * tr;
    boltz[k] = bz;
    epar[k] = (g * t0 * tr) / lpar;
    // An overflowed density has no Debye length (NaN), never 0.
    lD[k] = nr > 0 && nabs < Infinity ? Math.sqrt((EPS0_OVER_E * t0 * tr) / nabs) : NaN;
    presheath[k] = (-g * t0) / (g + 1);
    fl[k] = mask;
    valid[k] = mask & INVALID_MASK ? 0 : 1;
  }
}

export const parallelBalance: ModelDefinition = {
  id: 'parallel-balance',
  version: '1.1.0',
  title: 'Parallel force balance',
  summary:
    'Electron density, temperature and pressure along B from the Boltzmann relation and its polytropic generalisation, with the cutoff, sheath edge, presheath and floating-wall potential.',
  inputs,
  outputs,
  flags,
  thresholds,
  // No ordering parameter: its flags (cutoff, overflow) are conditions, not small ratios.
  orderings: [],
  evaluate(values, th) {
    return evaluateViaChunk(parallelBalance, values, th);
  },
  evaluateChunk,
};
