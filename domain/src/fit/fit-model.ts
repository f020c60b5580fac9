import { checkInput, validationFail, type CheckedData } from './input.js';
import { LIBRARY_MAX_POINTS } from './engine/library-stage.js';
import { runFit } from './engine/run-fit.js';
import { compileExpression } from './models/expression.js';
import { compileExponential } from './models/exponential.js';
import { compilePolytropic } from './models/polytropic.js';
import { compilePowerLaw } from './models/power-law.js';
import { compileProbeDouble, compileProbeRetarding } from './models/probe.js';
import { probeDensity } from './probe/density.js';
import { retardationRegion } from './probe/region.js';
import { DEFAULT_SIGMA_MODE, type CompiledModel, type FitInput, type FitResult } from './types.js';

function compile(request: FitInput, data: CheckedData): CompiledModel {
  switch (request.model) {
    case 'power-law':
      return compilePowerLaw(request, data);
    case 'exponential':
      return compileExponential(request, data);
    case 'polytropic':
      return compilePolytropic(request, data);
    case 'expression':
      return compileExpression(request, data);
    case 'probe-retarding':
      return compileProbeRetarding(request, data);
    case 'probe-double':
      return compileProbeDouble(request, data);
  }
}

/** Every k-th point, so the subsample spans the whole range of every column. */
function strided(data: CheckedData, maxPoints: number): CheckedData {
  const stride = Math.ceil(data.n / maxPoints);
  const m = Math.ceil(data.n / stride);
  const pick = (col: Float64Array): Float64Array => {
    const out = new Float64Array(m);
    for (let k = 0; k < m; k++) out[k] = col[k * stride]!;
    return out;
  };
  return { ...data, n: m, x: data.x.map(pick), y: pick(data.y), sigma: data.sigma ? pick(data.sigma) : undefined };
}

/**
 * Checks `fixed` and `sigmaMode` before compiling, and returns the request with the fixed values as
 * start values (so expression models see them as parameters and the models' own limits check them).
 */
function withFixedStarts(request: FitInput): FitInput {
  const fixed = request.fixed ?? {};
  for (const [name, v] of Object.entries(fixed)) {
    if (!Number.isFinite(v)) validationFail(`fixed.${name}`, `must be a finite number, got ${String(v)}`);
    if (request.bounds?.[name] !== undefined)
      validationFail(`fixed.${name}`, 'a parameter is either fixed or bounded, not both');
  }
  if (request.sigmaMode !== undefined && request.sigmaMode !== 'absolute' && request.sigmaMode !== 'relative')
    validationFail('sigmaMode', `must be "absolute" or "relative", got ${String(request.sigmaMode)}`);
  if (request.sigmaMode === 'absolute' && request.sigma === undefined)
    validationFail('sigmaMode', '"absolute" needs the σ column (weights) it takes as the measurement error');
  if (Object.keys(fixed).length === 0) return request;
  return { ...request, params: { ...request.params, ...fixed } };
}

/** Full-model index → fixed value; every fixed name must be a parameter of the compiled model. */
function fixedIndices(request: FitInput, model: CompiledModel): Map<number, number> {
  const out = new Map<number, number>();
  for (const [name, v] of Object.entries(request.fixed ?? {})) {
    const j = model.paramNames.indexOf(name);
    if (j < 0)
      validationFail(
        `fixed.${name}`,
        `is not a parameter of ${request.model} (parameters: ${model.paramNames.join(', ')})`,
      );
    out.set(j, v);
  }
  return out;
}

/**
 * Fits one of the reduced models to column data. Throws ValidationError for bad input, too few
 * points and structurally singular problems; a fit that does not converge comes back with
 * `converged: false`, a message and advice, never as a converged result.
 */
export function fitModel(original: FitInput): FitResult {
  const request = withFixedStarts(original);
  const checked = checkInput(request);
  if ((request.model === 'probe-retarding' || request.model === 'probe-double') && checked.x.length !== 1)
    validationFail('x', `${request.model} takes exactly one x column (the probe voltage V)`);
  const { data, region } = selectRegion(request, checked);
  const model = compile(request, data);
  const fixed = fixedIndices(request, model);
  let sub: { model: CompiledModel; data: CheckedData } | undefined;
  if (data.n > LIBRARY_MAX_POINTS) {
    const subData = strided(data, LIBRARY_MAX_POINTS);
    try {
      sub = { model: compile(request, subData), data: subData };
    } catch {
      sub = undefined; // the subsample alone may be degenerate; the full data were accepted
    }
  }
  const result = runFit(request.model, model, data, { fixed, sigmaMode: request.sigmaMode ?? DEFAULT_SIGMA_MODE }, sub);
  if (region) result.region = region;
  if (request.probe && (request.model === 'probe-retarding' || request.model === 'probe-double'))
    result.derived = [probeDensity(result, request.probe)];
  return result;
}

/** Probe-retarding: only the points in the retardation window (`range`, else chosen automatically). */
function selectRegion(request: FitInput, data: CheckedData): { data: CheckedData; region?: FitResult['region'] } {
  if (request.model !== 'probe-retarding') return { data };
  const v = data.x[0]!;
  const auto = request.range === undefined;
  const [vMin, vMax] =
    request.range ??
    (() => {
      const r = retardationRegion(v, data.y);
      return [r.vMin, r.vMax] as const;
    })();
  const keep: number[] = [];
  for (let i = 0; i < data.n; i++) if (v[i]! >= vMin && v[i]! <= vMax) keep.push(i);
  if (keep.length === data.n) return { data, region: { vMin, vMax, automatic: auto, used: data.n, of: data.n } };
  const pick = (col: Float64Array) => Float64Array.from(keep, (i) => col[i]!);
  return {
    data: {
      ...data,
      n: keep.length,
      x: data.x.map(pick),
      y: pick(data.y),
      sigma: data.sigma ? pick(data.sigma) : undefined,
    },
    region: { vMin, vMax, automatic: auto, used: keep.length, of: data.n },
  };
}
