import { requireMorePointsThanParams, type CheckedData } from '../input.js';
import type { CompiledModel, FitModelKind, FitResult } from '../types.js';
import { libraryStage } from './library-stage.js';
import { check, STEP_TOL } from './linearisation.js';
import { Problem } from './problem.js';
import { refine } from './refine.js';
import { summarise } from './summarise.js';

/**
 * Runs both stages (library LM, then our own refinement) and computes the statistics at the end point.
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
