import type { CheckedData } from '../input.js';
import { chiSquareUpperTail } from '../stats/chi-square.js';
import type { CompiledModel, FitModelKind, FitResult, SigmaMode } from '../types.js';
import { covarianceOf, type Linearisation } from './linearisation.js';
import type { Problem } from './problem.js';

/** Correlation r_ab = C_ab / sqrt(C_aa·C_bb); NaN where a variance is 0 or not finite. */
export function correlationOf(cov: number[][]): number[][] {
  return cov.map((row, a) =>
    row.map((c, b) => {
      const d = Math.sqrt(cov[a]![a]! * cov[b]![b]!);
      return d > 0 && Number.isFinite(d) ? Math.max(-1, Math.min(1, c / d)) : NaN;
    }),
  );
}

/**
 * Result assembly at the end point: fitted values, residuals, goodness of fit, information criteria
 * and the covariance, scaled by s² = RSS/dof unweighted, by the reduced χ² for relative σ, unscaled for
 * absolute σ (curve_fit's absolute_sigma=True: (JᵀWJ)⁻¹).
 */
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
  sigmaMode: SigmaMode,
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
  const weighted = data.sigma !== undefined;
  const s2 = weighted ? (sigmaMode === 'absolute' ? 1 : chi2 / dof) : rss / dof;
  const cov: number[][] = singular ? Array.from(params, () => Array.from(params, () => NaN)) : covarianceOf(lin, p, s2);
  // Least-squares AIC/BIC on the weighted sum of squares (plain RSS when unweighted), k free parameters.
  const ss = weighted ? chi2 : rss;
  const logLike = n * Math.log(ss / n);
  return {
    model: kind,
    parameters: model.paramNames.map((name, j) => ({
      name,
      value: params[j]!,
      stdError: Math.sqrt(cov[j]![j]!),
      fixed: false,
    })),
    rss,
    r2: tss > 0 ? 1 - rss / tss : rss === 0 ? 1 : 0,
    rmse: Math.sqrt(rss / n),
    residualSd: Math.sqrt(rss / dof),
    dof,
    n,
    iterations,
    converged,
    message,
    ...(weighted ? { chi2red: chi2 / dof, chi2, chi2PValue: chiSquareUpperTail(chi2, dof), sigmaMode } : {}),
    aic: logLike + 2 * p,
    bic: logLike + p * Math.log(n),
    correlation: correlationOf(cov),
    residuals,
    fitted,
    covariance: cov,
  };
}
