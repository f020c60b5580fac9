import { householderQr, jacobiSvd, reciprocalCondition } from '../linalg.js';
import { sumSquares, type Problem } from './problem.js';

/**
 * Linearisation at a point (Jacobian QR + SVD): the Gauss–Newton/LM step, the covariance factor and
 * the convergence test, shared by both optimiser stages and the final statistics.
 */

/**
 * Column-scaled Jacobian below this reciprocal condition number is treated as rank-deficient:
 * analytic Jacobians are exact to rounding, central differences only to about ε^(2/3) ≈ 4e-11,
 * so dependent columns look independent at that level.
 */
export const RCOND_ANALYTIC = 1e-12;
export const RCOND_DIFFERENCES = 1e-8;
/** Converged when the Gauss–Newton step is below this fraction of (|p| + standard error). */
export const STEP_TOL = 1e-9;
/** Looser limit accepted when rounding stops every descent (the precision floor of the data). */
export const STALL_TOL = 1e-6;

/** Local linearisation at a point: Gauss–Newton step, covariance factor and rank. */
export interface Linearisation {
  rss: number;
  /** Column norms of the weighted Jacobian (the scaling D). */
  d: Float64Array;
  u: Float64Array;
  s: Float64Array;
  v: Float64Array;
  /** Qᵀr on the column space. */
  c: Float64Array;
  rcond: number;
}

export function linearise(prob: Problem, params: Float64Array, r: Float64Array, jac: Float64Array): Linearisation {
  const { n, p } = prob;
  const rss = prob.residuals(params, r);
  prob.jacobian(params, jac);
  const d = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    let sq = 0;
    for (let i = 0; i < n; i++) sq += jac[j * n + i]! * jac[j * n + i]!;
    const norm = Math.sqrt(sq);
    d[j] = norm > 0 && Number.isFinite(norm) ? norm : 1;
    for (let i = 0; i < n; i++) jac[j * n + i] = jac[j * n + i]! / d[j]!;
  }
  prob.jScaled.set(jac);
  const b = Float64Array.from(r);
  const R = householderQr(jac, n, p, b);
  const { u, s, v } = jacobiSvd(R, p);
  const finite = s.every(Number.isFinite);
  return { rss, d, u, s, v, c: b.subarray(0, p), rcond: finite ? reciprocalCondition(s) : 0 };
}

/** Step δ solving (JᵀJ + λD²)δ = Jᵀr through the SVD of the scaled R; λ = 0 is Gauss–Newton. */
export function stepFor(lin: Linearisation, p: number, lambda: number, out: Float64Array): void {
  out.fill(0);
  const smax = Math.max(...lin.s);
  for (let k = 0; k < p; k++) {
    const sk = lin.s[k]!;
    if (lambda === 0 && !(sk > RCOND_ANALYTIC * smax)) continue; // pseudo-inverse on a null direction
    let utc = 0;
    for (let i = 0; i < p; i++) utc += lin.u[i * p + k]! * lin.c[i]!;
    const coef = (sk * utc) / (sk * sk + lambda);
    if (!Number.isFinite(coef)) continue;
    for (let j = 0; j < p; j++) out[j] = out[j]! + lin.v[j * p + k]! * coef;
  }
  for (let j = 0; j < p; j++) out[j] = out[j]! / lin.d[j]!;
}

/** Covariance (JᵀWJ)⁻¹·s² = s²·D⁻¹VΣ⁻²VᵀD⁻¹. */
export function covarianceOf(lin: Linearisation, p: number, s2: number): number[][] {
  const cov: number[][] = [];
  for (let a = 0; a < p; a++) {
    const row: number[] = [];
    for (let b = 0; b < p; b++) {
      let sum = 0;
      for (let k = 0; k < p; k++) sum += (lin.v[a * p + k]! * lin.v[b * p + k]!) / (lin.s[k]! * lin.s[k]!);
      row.push((s2 * sum) / (lin.d[a]! * lin.d[b]!));
    }
    cov.push(row);
  }
  return cov;
}

export function stepIsSmall(step: Float64Array, params: Float64Array, cov: number[][], tol: number): boolean {
  for (let j = 0; j < step.length; j++) {
    const se = Math.sqrt(Math.max(cov[j]![j]!, 0));
    const ref = Math.abs(params[j]!) + (Number.isFinite(se) ? se : 0);
    if (!(Math.abs(step[j]!) <= tol * ref)) return false;
  }
  return true;
}

export interface Check {
  lin: Linearisation;
  converged: boolean;
  singular: boolean;
}

export function check(prob: Problem, params: Float64Array, r: Float64Array, jac: Float64Array, tol: number): Check {
  const lin = linearise(prob, params, r, jac);
  const singular = !(lin.rcond >= (prob.model.jacobian ? RCOND_ANALYTIC : RCOND_DIFFERENCES));
  const step = new Float64Array(prob.p);
  stepFor(lin, prob.p, 0, step);
  // Projected step: at an active bound only the part of the step that stays feasible counts.
  for (let j = 0; j < prob.p; j++) {
    const to = Math.min(Math.max(params[j]! + step[j]!, prob.model.min[j]!), prob.model.max[j]!);
    step[j] = to - params[j]!;
  }
  const dof = prob.n - prob.p;
  const cov = covarianceOf(lin, prob.p, lin.rss / dof);
  // A vanishing residual (noise-free data) is an exact optimum whatever the step says.
  const exact = lin.rss <= 1e-30 * sumSquares(prob.y, prob.w);
  return {
    lin,
    singular,
    converged: !singular && Number.isFinite(lin.rss) && (exact || stepIsSmall(step, params, cov, tol)),
  };
}
