import { checkParamNames, resolveBounds, startValue, validationFail, type CheckedData } from '../input.js';
import { solveLeastSquares } from '../linalg.js';
import type { CompiledModel, FitInput } from '../types.js';

/** y = A·exp(x/s), the Boltzmann form n = n0·exp(φ/Te): the fitted s is Te. */
export function compileExponential(input: FitInput, data: CheckedData): CompiledModel {
  if (data.x.length !== 1) validationFail('x', `exponential takes exactly one x column, got ${data.x.length}`);
  const names = ['A', 's'];
  checkParamNames(input, names);
  const { n, y } = data;
  const x = data.x[0]!;
  const guess = logLinearGuess(x, y, n, input);
  const start = Float64Array.of(startValue(input, 'A', guess.A), startValue(input, 's', guess.s));
  if (start[1] === 0) validationFail('params.s', 'start value must not be 0 (s divides x)');
  const { min, max } = resolveBounds(input, names, start);
  const evaluate = (p: Float64Array, out: Float64Array): void => {
    const a = p[0]!;
    const inv = 1 / p[1]!;
    for (let i = 0; i < n; i++) out[i] = a * Math.exp(x[i]! * inv);
  };
  const jacobian = (p: Float64Array, jac: Float64Array): void => {
    const a = p[0]!;
    const s = p[1]!;
    const inv = 1 / s;
    for (let i = 0; i < n; i++) {
      const e = Math.exp(x[i]! * inv);
      jac[i] = e;
      jac[n + i] = -a * e * x[i]! * inv * inv;
    }
  };
  return { paramNames: names, start, min, max, n, evaluate, jacobian };
}

/** ln|y| = ln|A| + x/s when y has one sign; otherwise the caller must give start values. */
function logLinearGuess(x: Float64Array, y: Float64Array, n: number, input: FitInput): { A: number; s: number } {
  const positive = y.every((v) => v > 0);
  const negative = y.every((v) => v < 0);
  const given = input.params ?? {};
  if (!positive && !negative) {
    if (given.A !== undefined && given.s !== undefined) return { A: given.A, s: given.s };
    validationFail(
      'y',
      'exponential start values come from ln y, so y must keep one sign and be non-zero; otherwise give params A and s',
    );
  }
  if (n < 2) validationFail('y', `too few points: ${n} point(s) for 2 parameter(s)`);
  const a = new Float64Array(2 * n);
  a.fill(1, 0, n);
  a.set(x, n);
  const b = new Float64Array(n);
  for (let i = 0; i < n; i++) b[i] = Math.log(Math.abs(y[i]!));
  const sol = solveLeastSquares(a, n, 2, b);
  if (!sol) validationFail('x', 'singular problem: x takes a single value, so the scale s cannot be determined');
  const sign = positive ? 1 : -1;
  const slope = sol.x[1]!;
  // A flat ln y gives slope ≈ 0; start from a scale far wider than the data instead of 1/0.
  let span = 0;
  for (let i = 0; i < n; i++) span = Math.max(span, Math.abs(x[i]!));
  const s = Math.abs(slope) * span > 1e-6 ? 1 / slope : 1e6 * (span || 1);
  return { A: sign * Math.exp(sol.x[0]!), s };
}
