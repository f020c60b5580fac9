import { requireMorePointsThanParams, validationFail, type CheckedData } from '../input.js';
import type { CompiledModel, FitModelKind, FitResult, SigmaMode } from '../types.js';
import { solveWithActiveBounds } from './active-set.js';
import { adviseOnFailure } from './advice.js';
import { reduceModel, type ReducedModel } from './fixed.js';
import { libraryStage } from './library-stage.js';
import { check, STEP_TOL } from './linearisation.js';
import { Problem } from './problem.js';
import { refine } from './refine.js';
import { summarise } from './summarise.js';

export interface RunOptions {
  /** Full-model parameter index → value held fixed. */
  fixed: ReadonlyMap<number, number>;
  sigmaMode: SigmaMode;
}

/**
 * Runs both stages (library LM, then our own refinement) on the free parameters and computes the
 * statistics at the end point, then puts the fixed parameters back in their places.
 * `sub`, for large data: the same model compiled on a strided subsample. The library allocates
 * a matrix row object per point and iteration, so it only brings the start close on the
 * subsample; the allocation-free refinement then uses every point.
 */
export function runFit(
  kind: FitModelKind,
  fullModel: CompiledModel,
  data: CheckedData,
  options: RunOptions,
  sub?: { model: CompiledModel; data: CheckedData },
): FitResult {
  const reduced = reduceModel(fullModel, options.fixed);
  const model = reduced.model;
  const p = model.paramNames.length;
  if (p === 0) validationFail('fixed', 'every parameter is fixed; leave at least one free to fit');
  requireMorePointsThanParams(data.n, p);
  const prob = new Problem(model, data.y, data.sigma);
  const r = new Float64Array(data.n);
  const jac = new Float64Array(data.n * p);
  const params = Float64Array.from(model.start);
  prob.clamp(params);
  const libraryBudget = Math.max(1, Math.min(100, Math.floor(data.maxIterations / 2)));
  let lib = prob;
  if (sub) {
    lib = new Problem(reduceModel(sub.model, options.fixed).model, sub.data.y, sub.data.sigma);
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

  // A parameter on a bound: finish by the active set (the clamped steps cannot settle the others).
  const bounded = solveWithActiveBounds(
    prob,
    model,
    params,
    data.maxIterations,
    data.y,
    data.sigma,
    (m, y, sigma) => new Problem(m, y, sigma),
  );
  if (bounded) outcome = { ...bounded, iterations: outcome.iterations + bounded.iterations };

  const final = check(prob, params, r, jac, STEP_TOL);
  const singular = final.singular;
  let converged = outcome.converged && !singular;
  let message = outcome.message;
  const atBound = model.paramNames.filter((_, j) => params[j] === model.min[j] || params[j] === model.max[j]);
  if (converged && atBound.length > 0) {
    message += `; at a bound: ${atBound.join(', ')} (their standard errors assume the bound is not active)`;
  }
  if (singular) {
    message = `not converged: singular problem (rank-deficient JᵀJ, reciprocal condition ${final.lin.rcond.toExponential(2)}) at the last iterate`;
    converged = false;
  }
  const result = summarise(
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
    options.sigmaMode,
  );
  if (converged && options.sigmaMode !== 'absolute') withholdRoundingLevelErrors(result, data);
  if (!converged) {
    const start = Float64Array.from(model.start);
    prob.clamp(start);
    const why = adviseOnFailure(prob, model.paramNames, start, params, singular ? 'singular' : outcome.stop, final.lin);
    const full = reduced.expand(params);
    result.advice = {
      ...why,
      lastIterate: Object.fromEntries(fullModel.paramNames.map((name, j) => [name, full[j]!])),
    };
    result.message = `${message}; suspect the ${why.suspect === 'start' ? 'start values' : 'data'}: ${why.reason}`;
  }
  return expandFixed(result, fullModel, reduced, params);
}

/**
 * Residuals within about a thousand rounding units of the data (exact or 14-digit data, such as NIST's
 * Lanczos1) make s² = RSS/dof a measure of floating-point rounding, not of scatter: the parameters stand,
 * but standard errors scaled by s² would be numbers without meaning, so they are withheld (NaN) and the
 * message says why. Absolute σ does not use s² and keeps its errors.
 */
const ROUNDING_LEVEL = 1e3 * Number.EPSILON;

function withholdRoundingLevelErrors(result: FitResult, data: CheckedData): void {
  let peak = 0;
  for (let i = 0; i < data.n; i++) peak = Math.max(peak, Math.abs(data.y[i]!));
  if (!(result.rmse <= ROUNDING_LEVEL * peak)) return;
  for (const p of result.parameters) p.stdError = NaN;
  result.covariance = result.covariance.map((row) => row.map(() => NaN));
  result.correlation = result.correlation.map((row) => row.map(() => NaN));
  result.message += `; the residuals (RMS ${result.rmse.toExponential(2)}) are at the rounding level of double precision, so the scatter s² and the standard errors cannot be estimated and are withheld`;
}

/** Puts the fixed parameters back: value as held, stdError 0, zero covariance, correlation NaN. */
function expandFixed(result: FitResult, full: CompiledModel, reduced: ReducedModel, params: Float64Array): FitResult {
  if (reduced.free.length === full.paramNames.length) return result;
  const values = reduced.expand(params);
  const slot = new Map(reduced.free.map((j, k) => [j, k]));
  const names = full.paramNames;
  const pick = (m: number[][], fill: number) =>
    names.map((_, a) =>
      names.map((__, b) => {
        const ka = slot.get(a);
        const kb = slot.get(b);
        return ka !== undefined && kb !== undefined ? m[ka]![kb]! : fill;
      }),
    );
  return {
    ...result,
    parameters: names.map((name, j) => {
      const k = slot.get(j);
      return k !== undefined ? result.parameters[k]! : { name, value: values[j]!, stdError: 0, fixed: true };
    }),
    covariance: pick(result.covariance, 0),
    correlation: pick(result.correlation, NaN),
  };
}
