import { check, stepFor, STALL_TOL, STEP_TOL, type Linearisation } from './linearisation.js';
import type { Problem } from './problem.js';

/** How the refinement stopped: the advice for a failed fit starts from this. */
export type StopReason = 'converged' | 'nonfinite' | 'stalled' | 'singular' | 'budget';

export interface RefineOutcome {
  stop: StopReason;
  iterations: number;
  converged: boolean;
  message: string;
}

/**
 * Geodesic acceleration (Transtrum & Sethna 2012): a second-order correction a from the
 * directional second derivative of the residuals along the LM velocity v, so steps follow
 * curved valleys (Bennett5, MGH09) instead of creeping along them. Writes p + v + a/2 into
 * `trial`; returns false when the correction is too large to trust (2‖Da‖/‖Dv‖ > 0.75).
 */
export function geodesicCorrection(
  prob: Problem,
  lin: Linearisation,
  params: Float64Array,
  r: Float64Array,
  v: Float64Array,
  lambda: number,
  trial: Float64Array,
  rTrial: Float64Array,
): boolean {
  const { n, p } = prob;
  const h = 0.1;
  for (let j = 0; j < p; j++) trial[j] = params[j]! + h * v[j]!;
  prob.clamp(trial);
  prob.residuals(trial, rTrial);
  const js = prob.jScaled;
  const dv = new Float64Array(p);
  for (let j = 0; j < p; j++) dv[j] = lin.d[j]! * v[j]!;
  // g = (J D⁻¹)ᵀ r_vv with r_vv = (2/h)·((r(p + h v) − r)/h + J v)
  const g = new Float64Array(p);
  for (let i = 0; i < n; i++) {
    let jv = 0;
    for (let j = 0; j < p; j++) jv += js[j * n + i]! * dv[j]!;
    const rvv = (2 / h) * ((rTrial[i]! - r[i]!) / h + jv);
    if (!Number.isFinite(rvv)) return true; // no correction possible; fall back to the plain step
    for (let j = 0; j < p; j++) g[j] = g[j]! + js[j * n + i]! * rvv;
  }
  // a = D⁻¹·V·diag(1/(σ²+λ))·Vᵀ·g
  const da = new Float64Array(p);
  for (let k = 0; k < p; k++) {
    let vg = 0;
    for (let j = 0; j < p; j++) vg += lin.v[j * p + k]! * g[j]!;
    const sk2 = lin.s[k]! * lin.s[k]!;
    const coef = vg / (sk2 + lambda);
    if (!Number.isFinite(coef)) continue;
    for (let j = 0; j < p; j++) da[j] = da[j]! + lin.v[j * p + k]! * coef;
  }
  let na = 0;
  let nv = 0;
  for (let j = 0; j < p; j++) {
    na += da[j]! * da[j]!;
    nv += dv[j]! * dv[j]!;
  }
  if (!(2 * Math.sqrt(na) <= 0.75 * Math.sqrt(nv))) {
    for (let j = 0; j < p; j++) trial[j] = params[j]! + v[j]!;
    prob.clamp(trial);
    return lambda > 1e12; // at huge damping accept the plain step rather than stall
  }
  for (let j = 0; j < p; j++) trial[j] = params[j]! + v[j]! + da[j]! / (2 * lin.d[j]!);
  prob.clamp(trial);
  return true;
}

/** Predicted decrease of Σr² for the damped step (from the SVD of the scaled linear model). */
export function predictedDecrease(lin: Linearisation, p: number, lambda: number): number {
  let pred = 0;
  for (let k = 0; k < p; k++) {
    let utc = 0;
    for (let i = 0; i < p; i++) utc += lin.u[i * p + k]! * lin.c[i]!;
    const sk2 = lin.s[k]! * lin.s[k]!;
    const keep = lambda / (sk2 + lambda);
    pred += utc * utc * (1 - keep * keep);
  }
  return pred;
}

/**
 * Stage 2: our own Levenberg–Marquardt with Marquardt scaling, an explicit step test, and
 * Nielsen's damping update (λ follows the gain ratio), which crosses long curved valleys
 * such as Bennett5's far faster than fixed ×10 / ÷10 factors.
 */
export function refine(
  prob: Problem,
  params: Float64Array,
  budget: number,
  r: Float64Array,
  jac: Float64Array,
): RefineOutcome {
  const { p } = prob;
  const step = new Float64Array(p);
  const trial = new Float64Array(p);
  const rTrial = new Float64Array(prob.n);
  let lambda = 1e-3;
  let nu = 2;
  let singularSeen = false;
  for (let it = 0; it < budget; it++) {
    const st = check(prob, params, r, jac, STEP_TOL);
    if (st.converged)
      return {
        stop: 'converged',
        iterations: it,
        converged: true,
        message: 'converged: Gauss–Newton step below 1e-9 of |p| + standard error',
      };
    if (!Number.isFinite(st.lin.rss))
      return {
        stop: 'nonfinite',
        iterations: it,
        converged: false,
        message: 'not converged: the model is not finite at the current parameters',
      };
    singularSeen = st.singular;
    let accepted = false;
    while (!accepted && lambda <= 1e16) {
      stepFor(st.lin, p, lambda, step);
      if (!geodesicCorrection(prob, st.lin, params, r, step, lambda, trial, rTrial)) {
        lambda *= nu;
        nu *= 2;
        continue;
      }
      const rss = prob.residuals(trial, rTrial);
      if (rss < st.lin.rss) {
        const pred = predictedDecrease(st.lin, p, lambda);
        const rho = pred > 0 ? (st.lin.rss - rss) / pred : 1;
        params.set(trial);
        lambda = Math.max(lambda * Math.max(1 / 3, 1 - (2 * rho - 1) ** 3), 1e-15);
        nu = 2;
        accepted = true;
        break;
      }
      lambda *= nu;
      nu *= 2;
    }
    if (!accepted) {
      // No descent at any damping: the point is stationary to rounding, or we are stuck.
      if (st.singular) break;
      const final = check(prob, params, r, jac, STALL_TOL);
      if (final.converged)
        return {
          stop: 'converged',
          iterations: it + 1,
          converged: true,
          message:
            'converged to the rounding limit: no further decrease, Gauss–Newton step below 1e-6 of |p| + standard error',
        };
      return {
        stop: 'stalled',
        iterations: it + 1,
        converged: false,
        message:
          'not converged: no decrease of the residual sum of squares possible, but the step criterion is not met',
      };
    }
  }
  if (singularSeen) {
    return {
      stop: 'singular',
      iterations: budget,
      converged: false,
      message: 'not converged: singular problem (rank-deficient JᵀJ) at the last iterate',
    };
  }
  return { stop: 'budget', iterations: budget, converged: false, message: `not converged within ${budget} iterations` };
}
