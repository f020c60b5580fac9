import { checkParamNames, resolveBounds, startValue, validationFail, type CheckedData } from '../input.js';
import { solveLeastSquares } from '../linalg.js';
import type { CompiledModel, FitInput } from '../types.js';

/**
 * Whether the polytropic fit also fits the scale n0: always, unless the request says the data are
 * already n/n0 (`normalised: true`). No guess from the data's magnitude: a probe current in mA or a
 * density in 1e18 m⁻³ lies in any range, and a silently fixed n0 biases γ and Te.
 */
export function fitsScale(input: FitInput): boolean {
  return input.normalised !== true;
}

/**
 * y = n0·[1 + ((γ−1)/γ)·φ/Te]^(1/(γ−1)), parameters `gamma`, `Te_eV` and `n0` (in y's unit);
 * with `normalised: true` y is n/n0 (n0 = 1, not fitted). x = φ in volts.
 *
 * Written as ln(y/n0) = (t/γ)·g(z) with t = φ/Te, z = (1 − 1/γ)·t and g(z) = ln(1+z)/z, which is
 * smooth through z = 0: γ = 1 gives g = 1 and y = n0·exp(φ/Te) exactly, and near γ = 1 the
 * series of g keeps value and Jacobian free of the 0/0 in 1/(γ−1).
 * Points past the cutoff (1 + z ≤ 0) have zero density.
 */
export function compilePolytropic(input: FitInput, data: CheckedData): CompiledModel {
  if (data.x.length !== 1)
    validationFail('x', `polytropic takes exactly one x column (the potential φ), got ${data.x.length}`);
  const withScale = fitsScale(input);
  if (!withScale && (input.params?.n0 !== undefined || input.bounds?.n0 !== undefined)) {
    validationFail('normalised', 'with normalised data n0 is 1 and not fitted; drop the start value or bounds of n0');
  }
  checkParamNames(input, withScale ? ['gamma', 'Te_eV', 'n0'] : ['gamma', 'Te_eV']);
  const { n, y } = data;
  const phi = data.x[0]!;
  const names = withScale ? ['gamma', 'Te_eV', 'n0'] : ['gamma', 'Te_eV'];
  const guess = boltzmannGuess(phi, y, n, input);
  const startList = [startValue(input, 'gamma', 1), startValue(input, 'Te_eV', guess.te)];
  if (withScale) startList.push(startValue(input, 'n0', guess.n0));
  const start = Float64Array.from(startList);
  // γ > 0, Te > 0 and n0 > 0 (strict); tiny positive floors stand in for "> 0".
  const { min, max } = resolveBounds(input, names, start, {
    gamma: { min: 1e-6 },
    Te_eV: { min: 1e-300 },
    n0: { min: 1e-300 },
  });
  const evaluate = (p: Float64Array, out: Float64Array): void => {
    const gamma = p[0]!;
    const te = p[1]!;
    const n0 = withScale ? p[2]! : 1;
    const a = 1 - 1 / gamma;
    for (let i = 0; i < n; i++) {
      const t = phi[i]! / te;
      const z = a * t;
      out[i] = z <= -1 ? 0 : n0 * Math.exp((t / gamma) * g(z));
    }
  };
  const jacobian = (p: Float64Array, jac: Float64Array): void => {
    const gamma = p[0]!;
    const te = p[1]!;
    const n0 = withScale ? p[2]! : 1;
    const a = 1 - 1 / gamma;
    for (let i = 0; i < n; i++) {
      const t = phi[i]! / te;
      const z = a * t;
      if (z <= -1) {
        jac[i] = 0;
        jac[n + i] = 0;
        if (withScale) jac[2 * n + i] = 0;
        continue;
      }
      const gz = g(z);
      const shape = Math.exp((t / gamma) * gz);
      const yv = n0 * shape;
      // ∂ln y/∂γ = (t/γ²)·(t·g'(z)/γ − g(z));  ∂ln y/∂Te = −t/(Te·γ·(1+z));  ∂y/∂n0 = y/n0
      jac[i] = yv * (t / (gamma * gamma)) * ((t * gPrime(z)) / gamma - gz);
      jac[n + i] = (-yv * t) / (te * gamma * (1 + z));
      if (withScale) jac[2 * n + i] = shape;
    }
  };
  return { paramNames: names, start, min, max, n, evaluate, jacobian };
}

/** g(z) = ln(1+z)/z, by its series for small |z| (error < z⁷). */
export function g(z: number): number {
  if (Math.abs(z) < 1e-3) {
    return 1 + z * (-1 / 2 + z * (1 / 3 + z * (-1 / 4 + z * (1 / 5 + z * (-1 / 6 + z / 7)))));
  }
  return Math.log1p(z) / z;
}

/** g'(z) = (z/(1+z) − ln(1+z))/z², series near 0 where the difference cancels. */
export function gPrime(z: number): number {
  if (Math.abs(z) < 1e-3) {
    return -1 / 2 + z * (2 / 3 + z * (-3 / 4 + z * (4 / 5 + z * (-5 / 6 + z * (6 / 7)))));
  }
  return (z / (1 + z) - Math.log1p(z)) / (z * z);
}

/**
 * Start Te and n0 from the Boltzmann limit: ln y = ln n0 + φ/Te over the points with y > 0.
 * The intercept is n0 at φ = 0; if it is not usable, the y nearest φ = 0 stands in.
 */
function boltzmannGuess(phi: Float64Array, y: Float64Array, n: number, input: FitInput): { te: number; n0: number } {
  const idx: number[] = [];
  for (let i = 0; i < n; i++) if (y[i]! > 0) idx.push(i);
  const fallbackTe = input.params?.Te_eV;
  if (idx.length < 2) {
    if (fallbackTe !== undefined) return { te: fallbackTe, n0: nearestZero(phi, y, idx) };
    validationFail('y', 'polytropic needs at least two points with y > 0 to estimate a start Te; or give params.Te_eV');
  }
  const m = idx.length;
  const a = new Float64Array(2 * m);
  const b = new Float64Array(m);
  idx.forEach((i, r) => {
    a[r] = 1;
    a[m + r] = phi[i]!;
    b[r] = Math.log(y[i]!);
  });
  const sol = solveLeastSquares(a, m, 2, b);
  const slope = sol?.x[1];
  const intercept = sol ? Math.exp(sol.x[0]!) : NaN;
  const n0 = intercept > 0 && Number.isFinite(intercept) ? intercept : nearestZero(phi, y, idx);
  if (slope === undefined || !(slope > 0) || !Number.isFinite(1 / slope)) {
    if (fallbackTe !== undefined) return { te: fallbackTe, n0 };
    validationFail('y', 'y does not rise with φ, so no positive start Te follows from the data; give params.Te_eV');
  }
  return { te: 1 / slope, n0 };
}

/** The positive y at the φ nearest 0 (the reference point of n0); 1 when no y is positive. */
function nearestZero(phi: Float64Array, y: Float64Array, positive: number[]): number {
  let best = -1;
  for (const i of positive) if (best < 0 || Math.abs(phi[i]!) < Math.abs(phi[best]!)) best = i;
  return best < 0 ? 1 : y[best]!;
}
