import { checkInput } from './input.js';
import { runFit } from './engine.js';
import { compileExpression } from './models/expression.js';
import { compileExponential } from './models/exponential.js';
import { compilePolytropic } from './models/polytropic.js';
import { compilePowerLaw } from './models/power-law.js';
import type { CompiledModel, FitInput, FitResult } from './types.js';

/**
 * Fits one of the reduced models to column data. Throws ValidationError for bad input, too few
 * points and structurally singular problems; a fit that does not converge comes back with
 * `converged: false` and a message, never as a converged result.
 */
export function fitModel(request: FitInput): FitResult {
  const data = checkInput(request);
  let model: CompiledModel;
  switch (request.model) {
    case 'power-law':
      model = compilePowerLaw(request, data);
      break;
    case 'exponential':
      model = compileExponential(request, data);
      break;
    case 'polytropic':
      model = compilePolytropic(request, data);
      break;
    case 'expression':
      model = compileExpression(request, data);
      break;
  }
  return runFit(request.model, model, data);
}
