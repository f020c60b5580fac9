import { checkInput, type CheckedData } from './input.js';
import { LIBRARY_MAX_POINTS } from './engine/library-stage.js';
import { runFit } from './engine/run-fit.js';
import { compileExpression } from './models/expression.js';
import { compileExponential } from './models/exponential.js';
import { compilePolytropic } from './models/polytropic.js';
import { compilePowerLaw } from './models/power-law.js';
import type { CompiledModel, FitInput, FitResult } from './types.js';

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
 * Fits one of the reduced models to column data. Throws ValidationError for bad input, too few
 * points and structurally singular problems; a fit that does not converge comes back with
 * `converged: false` and a message, never as a converged result.
 */
export function fitModel(request: FitInput): FitResult {
  const data = checkInput(request);
  const model = compile(request, data);
  let sub: { model: CompiledModel; data: CheckedData } | undefined;
  if (data.n > LIBRARY_MAX_POINTS) {
    const subData = strided(data, LIBRARY_MAX_POINTS);
    try {
      sub = { model: compile(request, subData), data: subData };
    } catch {
      sub = undefined; // the subsample alone may be degenerate; the full data were accepted
    }
  }
  return runFit(request.model, model, data, sub);
}
