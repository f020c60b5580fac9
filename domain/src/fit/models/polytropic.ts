import { checkParamNames, resolveBounds, startValue, validationFail, type CheckedData } from '../input.js';
import { solveLeastSquares } from '../linalg.js';
import type { CompiledModel, FitInput } from '../types.js';

/**
 * n/n0 = [1 + ((γ−1)/γ)·φ/Te]^(1/(γ−1)), parameters `gamma`, `Te_eV`, x = φ in volts.
 *
 * Written as ln y = (t/γ)·g(z) with t = φ/Te, z = (1 − 1/γ)·t and g(z) = ln(1+z)/z, which is
 * smooth through z = 0: γ = 1 gives g = 1 and y = exp(φ/Te) exactly, and near γ = 1 the
 * series of g keeps value and Jacobian free of the 0/0 in 1/(γ−1).
 * Points past the cutoff (1 + z ≤ 0) have zero density.
 */
export function compilePolytropic(input: FitInput, data: CheckedData): CompiledModel {
  if (data.x.length !== 1) validationFail('x', `polytropic takes exactly one x column (the potential φ), got ${data.x.length}`);
  const names = ['gamma', 'Te_eV'];
  checkParamNames(input, names);
  const { n, y } = data;
  const phi = data.x[0]!;
  const start = Float64Array.of(startValue(input, 'gamma', 1), startValue(input, 'Te_eV', boltzmannTe(phi, y, n, input)));
  // γ > 0 and Te > 0 (strict); tiny positive floors stand in for "> 0".
  const { min, max } = resolveBounds(input, names, start, {
    gamma: { min: 1e-6 },
    Te_eV: { min: 1e-300 },
  });
  const evaluate = (p: Float64Array, out: Float64Array): void => {
    const gamma = p[0]!;
    const te = p[1]!;
    const a = 1 - 1 / gamma;
    for (let i = 0; i < n; i++) {
      const t = phi[i]! / te;
      const z = a * t;
      out[i] = z <= -1 ? 0 : Math.exp((t / gamma) * g(z));
    }
  };
  const jacobian = (p: Float64Array, jac: Float64Array): void => {
    const gamma = p[0]!;
    const te = p[1]!;
    const a = 1 - 1 / gamma;
    for (let i = 0; i < n; i++) {
      const t = phi[i]! / te;
      const z = a * t;
      if (z <= -1) {
        jac[i] = 0;
        jac[n + i] = 0;
        continue;
      }
      const gz = g(z);
      const yv = Math.exp((t / gamma) * gz);
      // ∂ln y/∂γ = (t/γ²)·(t·g'(z)/γ − g(z));  ∂ln y/∂Te = −t/(Te·γ·(1+z))
      jac[i] = yv * (t / (gamma * gamma)) * ((t * gPrime(z)) / gamma - gz);
      jac[n + i] = (-yv * t) / (te * gamma * (1 + z));
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

/** Start Te from the Boltzmann limit: ln y = c + φ/Te over the points with y > 0. */
function boltzmannTe(phi: Float64Array, y: Float64Array, n: number, input: FitInput): number {
  const idx: number[] = [];
  for (let i = 0; i < n; i++) if (y[i]! > 0) idx.push(i);
  const fallback = input.params?.Te_eV;
  if (idx.length < 2) {
    if (fallback !== undefined) return fallback;
    validationFail('y', 'polytropic needs at least two points with n/n0 > 0 to estimate a start Te; or give params.Te_eV');
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
  if (slope === undefined || !(slope > 0) || !Number.isFinite(1 / slope)) {
    if (fallback !== undefined) return fallback;
    validationFail('y', 'n/n0 does not rise with φ, so no positive start Te follows from the data; give params.Te_eV');
  }
  return 1 / slope;
}
