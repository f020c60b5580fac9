/** Public shapes of the fit engine (SPEC §6 and §8). */

export type FitModelKind =
  'power-law' | 'exponential' | 'polytropic' | 'expression' | 'probe-retarding' | 'probe-double';

export const FIT_MODEL_KINDS: readonly FitModelKind[] = [
  'power-law',
  'exponential',
  'polytropic',
  'expression',
  'probe-retarding',
  'probe-double',
];

export type SigmaMode = 'absolute' | 'relative';

export const DEFAULT_SIGMA_MODE: SigmaMode = 'relative';

export type Column = Float64Array | readonly number[];

export interface ParameterBound {
  min?: number;
  max?: number;
}

export interface FitInput {
  model: FitModelKind;
  /** Data columns by name; `xNames` chooses which ones are the independent variables. */
  x: Record<string, Column>;
  xNames: string[];
  y: Column;
  /** One standard deviation per point; turns the fit into weighted least squares (weights 1/σ²). */
  sigma?: Column;
  /**
   * With σ: 'relative' (default, as curve_fit's absolute_sigma=False) scales the covariance by the
   * reduced χ²; 'absolute' takes σ as the true measurement error, covariance (JᵀWJ)⁻¹ unscaled.
   */
  sigmaMode?: SigmaMode;
  /** Parameters held at a value: not fitted, stdError 0, not counted in the degrees of freedom. */
  fixed?: Record<string, number>;
  /** Polytropic only: y is n/n0 already, so n0 = 1 and is not fitted. Default false (n0 is fitted). */
  normalised?: boolean;
  /** Probe-retarding: fit only points with V in [lo, hi]; without it the retardation region is chosen automatically. */
  range?: readonly [number, number];
  /** Probe models: add a linear term for the sheath expansion (probe-retarding) or the slope (probe-double). */
  sheathSlope?: boolean;
  /** Probe models: collecting area and ion mass, for the density from I_is (result `derived`). */
  probe?: { area_m2: number; mu: number; h?: number };
  /** mathjs expression, for `model: 'expression'`. */
  expr?: string;
  /** Start values by parameter name (required for `expression`, optional overrides otherwise). */
  params?: Record<string, number>;
  /** Iteration budget per attempt (library stage + refinement; one retry from the start values if the first attempt fails). Default 500. */
  maxIterations?: number;
  bounds?: Record<string, ParameterBound>;
}

export interface FitParameter {
  name: string;
  value: number;
  /** Standard error from s²·(JᵀJ)⁻¹; 0 for a fixed parameter; NaN when the covariance cannot be formed. */
  stdError: number;
  /** Held at its value by the request (not fitted). */
  fixed: boolean;
}

/** Why a fit did not converge and where to start again (absent when it converged). */
export interface FitAdvice {
  /** 'start': the data can determine the parameters, the path from these start values failed; 'data': they cannot. */
  suspect: 'start' | 'data';
  /** The reason in words. */
  reason: string;
  /** The optimiser's last point, by parameter name (fixed ones included), to start again from. */
  lastIterate: Record<string, number>;
}

export interface FitResult {
  model: FitModelKind;
  parameters: FitParameter[];
  /** Unweighted residual sum of squares Σ (y − f)². */
  rss: number;
  /** Coefficient of determination 1 − RSS/TSS (unweighted). */
  r2: number;
  /** sqrt(RSS / n). */
  rmse: number;
  /** Residual standard deviation sqrt(RSS / dof), the figure NIST certifies. */
  residualSd: number;
  dof: number;
  n: number;
  iterations: number;
  converged: boolean;
  /** Why the fit stopped, in words; names the failure when `converged` is false. */
  message: string;
  /** Reduced χ² = Σ((y − f)/σ)² / dof, present only when sigma is given. */
  chi2red?: number;
  /** χ² = Σ((y − f)/σ)², its upper-tail p-value at dof, and the σ mode used; only when sigma is given. */
  chi2?: number;
  chi2PValue?: number;
  sigmaMode?: SigmaMode;
  /**
   * Akaike and Bayesian information criteria, least-squares form with additive constants dropped:
   * n·ln(χ²/n) + 2k and n·ln(χ²/n) + k·ln n, χ² the weighted (or plain) residual sum of squares,
   * k the number of free parameters (Burnham & Anderson 2002, §2.2; common practice).
   */
  aic: number;
  bic: number;
  /** Parameter correlation matrix in parameter order; NaN where a variance is 0 (fixed) or undefined. */
  correlation: number[][];
  advice?: FitAdvice;
  /** Quantities computed from the parameters (probe density n_m3), errors by the delta method. */
  derived?: { name: string; value: number; stdError: number; unit: string; method: string }[];
  /** Probe-retarding: the voltage window fitted (residuals and fitted values cover only its points). */
  region?: { vMin: number; vMax: number; automatic: boolean; used: number; of: number };
  /** Observed minus fitted, per point. */
  residuals: Float64Array;
  fitted: Float64Array;
  /** Parameter covariance (row-major p×p), already scaled by s² or reduced χ². */
  covariance: number[][];
}

/**
 * A model compiled against its data: evaluates all points at once into caller-owned buffers,
 * so the optimiser's inner loop allocates nothing.
 */
export interface CompiledModel {
  paramNames: string[];
  start: Float64Array;
  min: Float64Array;
  max: Float64Array;
  n: number;
  /** out[i] = f(x_i; p). */
  evaluate(p: Float64Array, out: Float64Array): void;
  /** Column-major n×p: jac[j*n + i] = ∂f(x_i; p)/∂p_j. Absent → central differences. */
  jacobian?(p: Float64Array, jac: Float64Array): void;
}
