/** Public shapes of the fit engine (SPEC §6 and §8). */

export type FitModelKind = 'power-law' | 'exponential' | 'polytropic' | 'expression';

export const FIT_MODEL_KINDS: readonly FitModelKind[] = ['power-law', 'exponential', 'polytropic', 'expression'];

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
  /** One standard deviation per point; turns the fit into weighted least squares (reduced χ²). */
  sigma?: Column;
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
  /** Standard error from s²·(JᵀJ)⁻¹; NaN when the covariance cannot be formed. */
  stdError: number;
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
