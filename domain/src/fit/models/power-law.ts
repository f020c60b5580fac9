import { checkParamNames, resolveBounds, startValue, validationFail, type CheckedData } from '../input.js';
import { solveLeastSquares } from '../linalg.js';
import type { CompiledModel, FitInput } from '../types.js';

/**
 * y = C·∏ x_k^a_k with parameters `C` and `exp_<column>`. Works on ln x_k computed once;
 * value and Jacobian are closed-form loops over preallocated buffers.
 */
export function compilePowerLaw(input: FitInput, data: CheckedData): CompiledModel {
  const { n, y } = data;
  const m = data.x.length;
  const names = ['C', ...data.xNames.map((c) => `exp_${c}`)];
  checkParamNames(input, names);
  for (let i = 0; i < n; i++) {
    if (!(y[i]! > 0)) validationFail('y', `power-law needs y > 0; row ${i} is ${y[i]} (fit |y| for a signed quantity)`);
  }
  const logX = data.x.map((col, k) => {
    const out = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      if (!(col[i]! > 0)) validationFail(`x.${data.xNames[k]}`, `power-law needs x > 0; row ${i} is ${col[i]}`);
      out[i] = Math.log(col[i]!);
    }
    return out;
  });
  const start = logLinearStart(logX, y, n, data.xNames);
  start[0] = startValue(input, 'C', start[0]!);
  for (let k = 0; k < m; k++) start[k + 1] = startValue(input, names[k + 1]!, start[k + 1]!);
  const { min, max } = resolveBounds(input, names, start);

  // out[i] = exp(ln C + Σ a_k ln x_ki); C may be negative after an override, so keep it as a factor.
  const evaluate = (p: Float64Array, out: Float64Array): void => {
    const c = p[0]!;
    out.fill(0);
    for (let k = 0; k < m; k++) {
      const a = p[k + 1]!;
      const lx = logX[k]!;
      for (let i = 0; i < n; i++) out[i] = out[i]! + a * lx[i]!;
    }
    for (let i = 0; i < n; i++) out[i] = c * Math.exp(out[i]!);
  };
  const jacobian = (p: Float64Array, jac: Float64Array): void => {
    const col0 = jac.subarray(0, n);
    col0.fill(0);
    for (let k = 0; k < m; k++) {
      const a = p[k + 1]!;
      const lx = logX[k]!;
      for (let i = 0; i < n; i++) col0[i] = col0[i]! + a * lx[i]!;
    }
    for (let i = 0; i < n; i++) col0[i] = Math.exp(col0[i]!); // ∂f/∂C = ∏ x^a
    const c = p[0]!;
    for (let k = 0; k < m; k++) {
      const lx = logX[k]!;
      const off = (k + 1) * n;
      for (let i = 0; i < n; i++) jac[off + i] = c * col0[i]! * lx[i]!; // ∂f/∂a_k = f·ln x_k
    }
  };
  return { paramNames: names, start, min, max, n, evaluate, jacobian };
}

/** ln y = ln C + Σ a_k ln x_k by least squares (QR/SVD); collinear inputs are a singular problem. */
function logLinearStart(logX: Float64Array[], y: Float64Array, n: number, xNames: string[]): Float64Array {
  const p = logX.length + 1;
  const a = new Float64Array(n * p);
  a.fill(1, 0, n);
  logX.forEach((col, k) => a.set(col, (k + 1) * n));
  const b = new Float64Array(n);
  for (let i = 0; i < n; i++) b[i] = Math.log(y[i]!);
  if (n < p)
    validationFail('y', `too few points: ${n} point(s) for ${p} parameter(s); a fit needs more points than parameters`);
  const sol = solveLeastSquares(a, n, p, b);
  if (!sol) {
    validationFail(
      'x',
      `singular problem: ln of the x columns (${xNames.join(', ')}) and a constant are linearly dependent, so their exponents cannot be separated (vary each input independently, or drop one)`,
    );
  }
  const start = Float64Array.from(sol.x);
  start[0] = Math.exp(start[0]!);
  return start;
}
