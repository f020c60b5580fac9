import {
  fitParameterUnit,
  retardationRegion,
  tQuantile,
  type FitInput,
  type FitOutcomeView,
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

/** What a completed (or non-converged) fit stores in fits.result: the contract's outcome shape. */
export type StoredFitResult = FitOutcomeView;

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

/**
 * Probe-retarding: the rows inside the voltage window (the request's `range`, else the retardation
 * region found in the data), so the stored plot shows exactly the points fitted.
 */
export function probeWindow(req: FitRequest, data: FitData): { data: FitData; region?: StoredFitResult['region'] } {
  if (req.model !== 'probe-retarding') return { data };
  const x = xNamesOf(req)[0]!;
  const v = data.data[x]!;
  const auto = req.range === undefined;
  const found = auto ? retardationRegion(v, data.data[req.y]!) : null;
  const [vMin, vMax] = req.range ?? [found!.vMin, found!.vMax];
  const keep: number[] = [];
  for (let i = 0; i < data.n; i++) if (v[i]! >= vMin && v[i]! <= vMax) keep.push(i);
  const columns = Object.fromEntries(
    Object.entries(data.data).map(([name, col]) => [name, Float64Array.from(keep, (i) => col[i]!)]),
  );
  return {
    data: { ...data, n: keep.length, data: columns },
    region: { vMin, vMax, automatic: auto, used: keep.length, of: data.n },
  };
}

/** The engine's input for a request and its extracted data. */
export function engineInput(req: FitRequest, data: FitData): { input: FitInput; flipped: boolean } {
  const xNames = xNamesOf(req);
  let y = data.data[req.y]!;
  const flipped = needsSignFlip(req, y);
  if (flipped) y = y.map((v) => -v);
  const x: Record<string, Float64Array> = {};
  for (const name of xNames) x[name] = data.data[name]!;
  // A sign-flipped power law fits −y: C's start, fixed value and bounds change sign with it.
  const flipC = <T extends Record<string, number> | undefined>(rec: T): T =>
    flipped && rec?.C !== undefined ? ({ ...rec, C: -rec.C } as T) : rec;
  const bounds = req.bounds
    ? Object.fromEntries(
        Object.entries(req.bounds).map(([name, [lo, hi]]) => {
          const [a, b] = flipped && name === 'C' ? [hi === null ? null : -hi, lo === null ? null : -lo] : [lo, hi];
          return [name, { ...(a !== null ? { min: a } : {}), ...(b !== null ? { max: b } : {}) }];
        }),
      )
    : undefined;
  return {
    input: {
      model: req.model,
      x,
      xNames,
      y,
      sigma: req.weights ? data.data[req.weights] : undefined,
      expr: req.expr,
      params: flipC(req.params),
      fixed: flipC(req.fixed),
      bounds,
      sigmaMode: req.sigmaMode,
      normalised: req.normalised,
      range: req.range,
      sheathSlope: req.sheathSlope,
      probe: req.probe,
      maxIterations: req.maxIterations,
    },
    flipped,
  };
}

/** Parameter units from the model and the columns' units (one rule, shared with the ui: domain fitParameterUnit). */
function paramUnit(req: FitRequest, name: string, units: Map<string, string>, r: FitResult): string | null {
  const xNames = xNamesOf(req);
  const values = Object.fromEntries(r.parameters.map((p) => [p.name, p.value]));
  return fitParameterUnit(
    { model: req.model, yUnit: units.get(req.y), xUnits: xNames.map((x) => units.get(x)), xNames, values },
    name,
  );
}

function sample(col: ArrayLike<number>, stride: number, m: number): (number | null)[] {
  const out = new Array<number | null>(m);
  for (let k = 0; k < m; k++) out[k] = finite(col[k * stride]!);
  return out;
}

/** Confidence intervals, units, the sign restored, the plot subsample: the fit as stored and shown. */
export function buildStoredResult(
  req: FitRequest,
  data: FitData,
  r: FitResult,
  flipped: boolean,
  region?: StoredFitResult['region'],
): StoredFitResult {
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
      unit: paramUnit(req, p.name, units, r),
      ci95:
        !p.fixed && Number.isFinite(half) && Number.isFinite(value) ? { low: value - half, high: value + half } : null,
      fixed: p.fixed,
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
    ...(r.chi2 !== undefined ? { chi2: finite(r.chi2), chi2PValue: finite(r.chi2PValue ?? NaN) } : {}),
    ...(r.sigmaMode ? { sigmaMode: r.sigmaMode } : {}),
    aic: finite(r.aic),
    bic: finite(r.bic),
    correlation: r.correlation.map((row, i) => row.map((v, j) => finite((i === 0) !== (j === 0) ? s * v : v))),
    derived: (r.derived ?? []).map((d) => ({ ...d, value: finite(d.value), stdError: finite(d.stdError) })),
    ...(region ? { region } : {}),
    ...(r.advice
      ? {
          advice: {
            ...r.advice,
            lastIterate:
              flipped && r.advice.lastIterate.C !== undefined
                ? { ...r.advice.lastIterate, C: -r.advice.lastIterate.C }
                : r.advice.lastIterate,
          },
        }
      : {}),
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
