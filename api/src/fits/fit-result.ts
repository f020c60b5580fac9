import {
  tQuantile,
  type FitInput,
  type FitParameterView,
  type FitPlotData,
  type FitRequest,
  type FitResult,
} from '@driftgrid/domain';
import type { FitData } from './fit-sources.js';

/** Points kept for the data/residual plots; every k-th point, so the subsample spans the data. */
export const PLOT_MAX_POINTS = 2000;
export const CONFIDENCE_LEVEL = 0.95;
export const CONFIDENCE_METHOD =
  "value ± t·stdError, t the Student-t quantile for (1 + 0.95)/2 at the fit's degrees of freedom (regularized incomplete beta, inverted by bisection)";

export type { FitParameterView, FitPlotData };

/** What a completed (or non-converged) fit stores in fits.result. */
export interface StoredFitResult {
  parameters: FitParameterView[];
  confidence: { level: number; method: string; t: number | null; dof: number };
  rss: number | null;
  r2: number | null;
  rmse: number | null;
  residualSd: number | null;
  chi2red?: number | null;
  dof: number;
  n: number;
  dropped: number;
  iterations: number;
  converged: boolean;
  message: string;
  /** Power law on all-negative y: fitted |y|, then C carries the sign back. */
  signRestored: boolean;
  covariance: (number | null)[][];
  /** Canonical units of the columns used (y, x, weights), for labels. */
  units: Record<string, string>;
  plot: FitPlotData;
}

/** JSON has no NaN or ∞: they become null (the ui shows "—"). */
export function finite(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

export function xNamesOf(req: Pick<FitRequest, 'x'>): string[] {
  return Array.isArray(req.x) ? [...req.x] : [req.x];
}

/** A power law of a quantity that is negative everywhere (vDi) fits |y| and restores the sign on C. */
export function needsSignFlip(req: Pick<FitRequest, 'model'>, y: Float64Array): boolean {
  if (req.model !== 'power-law' || y.length === 0) return false;
  for (let i = 0; i < y.length; i++) if (!(y[i]! < 0)) return false;
  return true;
}

/** The engine's input for a request and its extracted data. */
export function engineInput(req: FitRequest, data: FitData): { input: FitInput; flipped: boolean } {
  const xNames = xNamesOf(req);
  let y = data.data[req.y]!;
  const flipped = needsSignFlip(req, y);
  if (flipped) y = y.map((v) => -v);
  const x: Record<string, Float64Array> = {};
  for (const name of xNames) x[name] = data.data[name]!;
  const params = flipped && req.params?.C !== undefined ? { ...req.params, C: -req.params.C } : req.params;
  return {
    input: {
      model: req.model,
      x,
      xNames,
      y,
      sigma: req.weights ? data.data[req.weights] : undefined,
      expr: req.expr,
      params,
      maxIterations: req.maxIterations,
    },
    flipped,
  };
}

function paramUnit(req: FitRequest, name: string, units: Map<string, string>): string | null {
  const xs = xNamesOf(req);
  switch (req.model) {
    case 'power-law':
      return name === 'C' ? null : '1';
    case 'exponential':
      return name === 'A' ? units.get(req.y) || null : units.get(xs[0]!) || null;
    case 'polytropic':
      // n0 is the density scale, in y's unit (m^-3 for a density column); γ is a pure number.
      if (name === 'n0') return units.get(req.y) || null;
      return name === 'Te_eV' ? 'eV' : '1';
    default:
      return null;
  }
}

function sample(col: ArrayLike<number>, stride: number, m: number): (number | null)[] {
  const out = new Array<number | null>(m);
  for (let k = 0; k < m; k++) out[k] = finite(col[k * stride]!);
  return out;
}

/** Confidence intervals, units, the sign restored, the plot subsample: the fit as stored and shown. */
export function buildStoredResult(req: FitRequest, data: FitData, r: FitResult, flipped: boolean): StoredFitResult {
  const s = flipped ? -1 : 1;
  const fitted = flipped ? r.fitted.map((v) => -v) : r.fitted;
  const residuals = flipped ? r.residuals.map((v) => -v) : r.residuals;
  const covariance = r.covariance.map((row, i) => row.map((v, j) => finite((i === 0) !== (j === 0) ? s * v : v)));
  const t = r.dof > 0 ? tQuantile((1 + CONFIDENCE_LEVEL) / 2, r.dof) : NaN;
  const units = new Map(data.columns.map((c) => [c.name, c.unit]));
  const parameters = r.parameters.map((p, j): FitParameterView => {
    const value = j === 0 && flipped ? -p.value : p.value;
    const half = t * p.stdError;
    return {
      name: p.name,
      value: finite(value),
      stdError: finite(p.stdError),
      unit: paramUnit(req, p.name, units),
      ci95: Number.isFinite(half) && Number.isFinite(value) ? { low: value - half, high: value + half } : null,
    };
  });
  const xNames = xNamesOf(req);
  const stride = Math.max(1, Math.ceil(r.n / PLOT_MAX_POINTS));
  const m = Math.ceil(r.n / stride);
  const x: Record<string, (number | null)[]> = {};
  for (const name of xNames) x[name] = sample(data.data[name]!, stride, m);
  return {
    parameters,
    confidence: { level: CONFIDENCE_LEVEL, method: CONFIDENCE_METHOD, t: finite(t), dof: r.dof },
    rss: finite(r.rss),
    r2: finite(r.r2),
    rmse: finite(r.rmse),
    residualSd: finite(r.residualSd),
    ...(r.chi2red !== undefined ? { chi2red: finite(r.chi2red) } : {}),
    dof: r.dof,
    n: r.n,
    dropped: data.dropped,
    iterations: r.iterations,
    converged: r.converged,
    message: r.message,
    signRestored: flipped,
    covariance,
    units: Object.fromEntries(
      [req.y, ...xNames, ...(req.weights ? [req.weights] : [])].map((c) => [c, units.get(c) ?? '']),
    ),
    plot: {
      xNames,
      x,
      y: sample(data.data[req.y]!, stride, m),
      fitted: sample(fitted, stride, m),
      residuals: sample(residuals, stride, m),
      total: r.n,
      shown: m,
    },
  };
}
