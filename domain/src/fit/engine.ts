import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { requireMorePointsThanParams, type CheckedData } from './input.js';
import { householderQr, jacobiSvd, reciprocalCondition } from './linalg.js';
import type { CompiledModel, FitModelKind, FitResult } from './types.js';

/**
 * Column-scaled Jacobian below this reciprocal condition number is treated as rank-deficient:
 * analytic Jacobians are exact to rounding, central differences only to about ε^(2/3) ≈ 4e-11,
 * so dependent columns look independent at that level.
 */
const RCOND_ANALYTIC = 1e-12;
const RCOND_DIFFERENCES = 1e-8;
/** Converged when the Gauss–Newton step is below this fraction of (|p| + standard error). */
const STEP_TOL = 1e-9;
/** Looser limit accepted when rounding stops every descent (the precision floor of the data). */
const STALL_TOL = 1e-6;
const LIBRARY_CHUNK = 10;
/** Above this many points the library stage runs on a strided subsample (see fit-model.ts). */
export const LIBRARY_MAX_POINTS = 5_000;

/** Residuals and Jacobian of the weighted problem r = w·(y − f), with reused buffers. */
class Problem {
  readonly n: number;
  readonly p: number;
  readonly w: Float64Array;
  readonly scale: Float64Array;
  private readonly f: Float64Array;
  private readonly fPlus: Float64Array;
  private readonly fMinus: Float64Array;
  private readonly pTmp: Float64Array;
  /** Column-scaled weighted Jacobian kept from the last linearisation (QR destroys `jac`). */
  readonly jScaled: Float64Array;
  evaluations = 0;

  constructor(
    readonly model: CompiledModel,
    readonly y: Float64Array,
    sigma: Float64Array | undefined,
  ) {
    this.n = model.n;
    this.p = model.paramNames.length;
    this.w = new Float64Array(this.n);
    for (let i = 0; i < this.n; i++) this.w[i] = sigma ? 1 / sigma[i]! : 1;
    // Typical size of each parameter, for finite-difference steps and the library's scaled space.
    this.scale = model.start.map((v) => (v !== 0 && Number.isFinite(v) ? Math.abs(v) : 1));
    this.f = new Float64Array(this.n);
    this.fPlus = new Float64Array(this.n);
    this.fMinus = new Float64Array(this.n);
    this.pTmp = new Float64Array(this.p);
    this.jScaled = new Float64Array(this.n * this.p);
  }

  /** Fills r with w·(y − f(p)); returns Σ r² (NaN if any point is not finite). */
  residuals(params: Float64Array, r: Float64Array): number {
    this.evaluations++;
    this.model.evaluate(params, this.f);
    let sum = 0;
    for (let i = 0; i < this.n; i++) {
      const ri = this.w[i]! * (this.y[i]! - this.f[i]!);
      r[i] = ri;
      sum += ri * ri;
    }
    return Number.isFinite(sum) ? sum : NaN;
  }

  /** Column-major weighted model Jacobian w·∂f/∂p: analytic, else central differences. */
  jacobian(params: Float64Array, jac: Float64Array): void {
    const { n, p } = this;
    if (this.model.jacobian) {
      this.model.jacobian(params, jac);
    } else {
      const { min, max } = this.model;
      for (let j = 0; j < p; j++) {
        this.pTmp.set(params);
        // Relative step ∛ε·|p| balances truncation O(h²) against rounding O(ε/h).
        let h = 6.055454e-6 * Math.max(Math.abs(params[j]!), 1e-3 * this.scale[j]!);
        let up = params[j]! + h <= max[j]!;
        let down = params[j]! - h >= min[j]!;
        if (!up && !down) {
          // Bounds closer than the step on both sides: a one-sided difference into the wider room.
          const roomUp = max[j]! - params[j]!;
          const roomDown = params[j]! - min[j]!;
          up = roomUp >= roomDown;
          down = !up;
          h = Math.max(roomUp, roomDown) / 2;
        }
        this.pTmp[j] = up ? params[j]! + h : params[j]!;
        this.model.evaluate(this.pTmp, this.fPlus);
        this.pTmp[j] = down ? params[j]! - h : params[j]!;
        this.model.evaluate(this.pTmp, this.fMinus);
        const span = (up ? h : 0) + (down ? h : 0);
        const off = j * n;
        for (let i = 0; i < n; i++) jac[off + i] = (this.fPlus[i]! - this.fMinus[i]!) / span;
      }
      this.evaluations += 2 * p;
    }
    for (let j = 0; j < p; j++) {
      const off = j * n;
      for (let i = 0; i < n; i++) jac[off + i] = jac[off + i]! * this.w[i]!;
    }
  }

  clamp(params: Float64Array): void {
    for (let j = 0; j < this.p; j++) params[j] = Math.min(Math.max(params[j]!, this.model.min[j]!), this.model.max[j]!);
  }
}

/** Local linearisation at a point: Gauss–Newton step, covariance factor and rank. */
interface Linearisation {
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

function linearise(prob: Problem, params: Float64Array, r: Float64Array, jac: Float64Array): Linearisation {
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
function stepFor(lin: Linearisation, p: number, lambda: number, out: Float64Array): void {
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
function covarianceOf(lin: Linearisation, p: number, s2: number): number[][] {
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

function stepIsSmall(step: Float64Array, params: Float64Array, cov: number[][], tol: number): boolean {
  for (let j = 0; j < step.length; j++) {
    const se = Math.sqrt(Math.max(cov[j]![j]!, 0));
    const ref = Math.abs(params[j]!) + (Number.isFinite(se) ? se : 0);
    if (!(Math.abs(step[j]!) <= tol * ref)) return false;
  }
  return true;
}

interface Check {
  lin: Linearisation;
  converged: boolean;
  singular: boolean;
}

function check(prob: Problem, params: Float64Array, r: Float64Array, jac: Float64Array, tol: number): Check {
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

function sumSquares(y: Float64Array, w: Float64Array): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (w[i]! * y[i]!) ** 2;
  return s;
}

/**
 * Stage 1: ml-levenberg-marquardt in a scaled space (u = p/scale, residuals divided by their
 * RMS) so its absolute damping means the same for every problem; run in chunks and stopped
 * as soon as our own step criterion holds, since its own test is an absolute RSS threshold.
 */
function libraryStage(
  prob: Problem,
  lib: Problem,
  params: Float64Array,
  budget: number,
  r: Float64Array,
  jac: Float64Array,
): number {
  const { p, scale } = prob;
  const n = lib.n;
  const libJac = lib === prob ? jac : new Float64Array(n * p);
  let yScale = Math.sqrt(sumSquares(lib.y, lib.w) / n);
  if (!(yScale > 0) || !Number.isFinite(yScale)) yScale = 1;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = i;
    ys[i] = (lib.w[i]! * lib.y[i]!) / yScale;
  }
  const pBuf = new Float64Array(p);
  const fBuf = new Float64Array(n);
  const partials = new Array<number>(p).fill(0);
  const toParams = (u: number[]): void => {
    for (let j = 0; j < p; j++) pBuf[j] = u[j]! * scale[j]!;
  };
  // The library asks for a function per parameter vector and then calls it for each x (our index).
  const modelFn = (u: number[]) => {
    toParams(u);
    lib.model.evaluate(pBuf, fBuf);
    for (let i = 0; i < n; i++) fBuf[i] = (lib.w[i]! * fBuf[i]!) / yScale;
    return (i: number) => fBuf[i]!;
  };
  const jacobianFn = (u: number[]) => {
    toParams(u);
    lib.jacobian(pBuf, libJac);
    return (i: number) => {
      for (let j = 0; j < p; j++) partials[j] = (libJac[j * n + i]! * scale[j]!) / yScale;
      return partials;
    };
  };
  const minValues = Array.from(prob.model.min, (v, j) => v / scale[j]!);
  const maxValues = Array.from(prob.model.max, (v, j) => v / scale[j]!);
  let used = 0;
  // A start that already meets the step test (an exact log-linear start) needs no library pass.
  if (check(prob, params, r, jac, STEP_TOL).converged) return 0;
  let best = prob.residuals(params, r);
  const chunk = LIBRARY_CHUNK;
  while (used < budget) {
    const iterations = Math.min(chunk, budget - used);
    let out;
    try {
      out = levenbergMarquardt({ x: xs, y: ys }, modelFn, {
        initialValues: Array.from(params, (v, j) => v / scale[j]!),
        jacobianFunction: jacobianFn,
        minValues,
        maxValues,
        maxIterations: iterations,
        errorTolerance: 0,
        damping: 1e-2,
      });
    } catch {
      break; // e.g. a non-invertible damped matrix: leave the rest to the refinement stage
    }
    used += Math.max(out.iterations, 1);
    const candidate = Float64Array.from(out.parameterValues, (v, j) => v * scale[j]!);
    prob.clamp(candidate);
    const rss = prob.residuals(candidate, r);
    if (!(rss < best)) break; // no progress in a whole chunk
    best = rss;
    params.set(candidate);
    // On a subsample the full-data step test cannot pass: one chunk brings the start close.
    if (lib !== prob || check(prob, params, r, jac, STEP_TOL).converged) break;
  }
  return used;
}

export interface RefineOutcome {
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
function geodesicCorrection(
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
function predictedDecrease(lin: Linearisation, p: number, lambda: number): number {
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
function refine(
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
        iterations: it,
        converged: true,
        message: 'converged: Gauss–Newton step below 1e-9 of |p| + standard error',
      };
    if (!Number.isFinite(st.lin.rss))
      return {
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
      lambda = 1e-3;
      nu = 2;
      if (st.singular) break;
      const final = check(prob, params, r, jac, STALL_TOL);
      if (final.converged)
        return {
          iterations: it + 1,
          converged: true,
          message:
            'converged to the rounding limit: no further decrease, Gauss–Newton step below 1e-6 of |p| + standard error',
        };
      return {
        iterations: it + 1,
        converged: false,
        message:
          'not converged: no decrease of the residual sum of squares possible, but the step criterion is not met',
      };
    }
  }
  if (singularSeen) {
    return {
      iterations: budget,
      converged: false,
      message:
        'not converged: singular problem (rank-deficient JᵀJ); the parameters cannot all be determined from these data',
    };
  }
  return { iterations: budget, converged: false, message: `not converged within ${budget} iterations` };
}

/** Runs both stages and computes the statistics at the end point. */
/**
 * `sub`, for large data: the same model compiled on a strided subsample. The library allocates
 * a matrix row object per point and iteration, so it only brings the start close on the
 * subsample; the allocation-free refinement then uses every point.
 */
export function runFit(
  kind: FitModelKind,
  model: CompiledModel,
  data: CheckedData,
  sub?: { model: CompiledModel; data: CheckedData },
): FitResult {
  const p = model.paramNames.length;
  requireMorePointsThanParams(data.n, p);
  const prob = new Problem(model, data.y, data.sigma);
  const r = new Float64Array(data.n);
  const jac = new Float64Array(data.n * p);
  const params = Float64Array.from(model.start);
  prob.clamp(params);
  const libraryBudget = Math.max(1, Math.min(100, Math.floor(data.maxIterations / 2)));
  let lib = prob;
  if (sub) {
    lib = new Problem(sub.model, sub.data.y, sub.data.sigma);
    lib.scale.set(prob.scale);
  }
  const libIts = libraryStage(prob, lib, params, libraryBudget, r, jac);
  let outcome = refine(prob, params, Math.max(1, data.maxIterations - libIts), r, jac);
  if (!outcome.converged) {
    // The library's path can end in a flat region (BoxBOD from NIST start 1); one more try with
    // our own damping straight from the start values, kept only if it converges.
    const again = Float64Array.from(model.start);
    prob.clamp(again);
    const retry = refine(prob, again, data.maxIterations, r, jac);
    if (retry.converged) {
      params.set(again);
      outcome = { ...retry, iterations: outcome.iterations + retry.iterations };
    } else {
      outcome = { ...outcome, iterations: outcome.iterations + retry.iterations };
    }
  }

  const final = check(prob, params, r, jac, STEP_TOL);
  const singular = final.singular;
  let converged = outcome.converged && !singular;
  let message = outcome.message;
  const atBound = model.paramNames.filter((_, j) => params[j] === model.min[j] || params[j] === model.max[j]);
  if (converged && atBound.length > 0) {
    message += `; at a bound: ${atBound.join(', ')} (their standard errors assume the bound is not active)`;
  }
  if (singular) {
    message = `not converged: singular problem (rank-deficient JᵀJ, reciprocal condition ${final.lin.rcond.toExponential(2)}); the parameters cannot all be determined from these data`;
    converged = false;
  }
  return summarise(
    kind,
    model,
    data,
    params,
    final.lin,
    prob,
    libIts + outcome.iterations,
    converged,
    message,
    singular,
  );
}

function summarise(
  kind: FitModelKind,
  model: CompiledModel,
  data: CheckedData,
  params: Float64Array,
  lin: Linearisation,
  prob: Problem,
  iterations: number,
  converged: boolean,
  message: string,
  singular: boolean,
): FitResult {
  const { n } = data;
  const p = params.length;
  const fitted = new Float64Array(n);
  model.evaluate(params, fitted);
  const residuals = new Float64Array(n);
  let rss = 0;
  let chi2 = 0;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += data.y[i]!;
  mean /= n;
  let tss = 0;
  for (let i = 0; i < n; i++) {
    const ri = data.y[i]! - fitted[i]!;
    residuals[i] = ri;
    rss += ri * ri;
    chi2 += (ri * prob.w[i]!) ** 2;
    tss += (data.y[i]! - mean) ** 2;
  }
  const dof = n - p;
  // s² is RSS/dof, or the reduced χ² when σ is given (weights 1/σ²).
  const s2 = (data.sigma ? chi2 : rss) / dof;
  const cov: number[][] = singular ? Array.from(params, () => Array.from(params, () => NaN)) : covarianceOf(lin, p, s2);
  return {
    model: kind,
    parameters: model.paramNames.map((name, j) => ({ name, value: params[j]!, stdError: Math.sqrt(cov[j]![j]!) })),
    rss,
    r2: tss > 0 ? 1 - rss / tss : rss === 0 ? 1 : 0,
    rmse: Math.sqrt(rss / n),
    residualSd: Math.sqrt(rss / dof),
    dof,
    n,
    iterations,
    converged,
    message,
    ...(data.sigma ? { chi2red: chi2 / dof } : {}),
    residuals,
    fitted,
    covariance: cov,
  };
}
