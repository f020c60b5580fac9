/** Shapes of a stored fit shared by the api (which writes them) and the ui (which shows them). */
export interface FitParameterView {
  name: string;
  value: number | null;
  stdError: number | null;
  /** Unit where the model makes it plain (exponents '1', polytropic Te in eV and n0 in y's unit, exponential s in x's unit). */
  unit: string | null;
  ci95: { low: number; high: number } | null;
}

/** Down-sampled data for the data/fit and residual plots. */
export interface FitPlotData {
  xNames: string[];
  x: Record<string, (number | null)[]>;
  y: (number | null)[];
  fitted: (number | null)[];
  residuals: (number | null)[];
  /** Points in the fit, and points in these arrays. */
  total: number;
  shown: number;
}
