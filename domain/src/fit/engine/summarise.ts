import type { CheckedData } from '../input.js';
import type { CompiledModel, FitModelKind, FitResult } from '../types.js';
import { covarianceOf, type Linearisation } from './linearisation.js';
import type { Problem } from './problem.js';

/** Result assembly: fitted values, residuals, goodness of fit and the scaled covariance at the end point. */
export function summarise(
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
