import type { FitAdvice } from '../types.js';
import { linearise, RCOND_ANALYTIC, RCOND_DIFFERENCES, type Linearisation } from './linearisation.js';
import type { Problem } from './problem.js';
import type { StopReason } from './refine.js';

/** Parameters whose Jacobian column, scaled by |p|, is (nearly) zero at a point: the model does not depend on them there. */
function flatParameters(prob: Problem, params: Float64Array, names: string[]): string[] {
  const { n } = prob;
  const jac = new Float64Array(n * prob.p);
  prob.jacobian(params, jac);
  const size = names.map((_, j) => {
    let sq = 0;
    for (let i = 0; i < n; i++) sq += jac[j * n + i]! ** 2;
    return Math.sqrt(sq) * Math.max(Math.abs(params[j]!), 1e-300);
  });
  const top = Math.max(...size.filter(Number.isFinite), 0);
  return names.filter((_, j) => !(size[j]! > 1e-8 * top));
}

function isSingular(prob: Problem, lin: Linearisation): boolean {
  return !(lin.rcond >= (prob.model.jacobian ? RCOND_ANALYTIC : RCOND_DIFFERENCES));
}

/**
 * Why a fit failed, told apart by comparing the last iterate with the start: when the data determine
 * every parameter at the start values but the path ends where they do not (a parameter lost its effect,
 * as BoxBOD's rate constant does when it runs off to 10⁶ from NIST start 1), or the model stops being
 * finite, or the budget ran out while the fit still improved, the start values are to blame. When the
 * problem is already singular at the start, or the fit stalls at the rounding floor with a step that
 * will not shrink, the data (too few distinct x, dependent inputs, noise) are.
 */
export function adviseOnFailure(
  prob: Problem,
  names: string[],
  start: Float64Array,
  end: Float64Array,
  stop: StopReason,
  endLin: Linearisation,
): Omit<FitAdvice, 'lastIterate'> {
  const r = new Float64Array(prob.n);
  const jac = new Float64Array(prob.n * prob.p);
  const startLin = linearise(prob, start, r, jac);
  const startOk = Number.isFinite(startLin.rss) && !isSingular(prob, startLin);
  if (stop === 'nonfinite' || !Number.isFinite(endLin.rss)) {
    return {
      suspect: 'start',
      reason: 'the model stopped being finite along the path from these start values; start nearer the expected values',
    };
  }
  if (isSingular(prob, endLin)) {
    if (!startOk) {
      const flat = flatParameters(prob, start, names);
      return {
        suspect: 'data',
        reason: `the data cannot determine every parameter even at the start values${flat.length ? ` (${flat.join(', ')} has no effect on the model there)` : ' (some parameters act only in combination)'}; add points where they matter, fix a parameter, or simplify the model`,
      };
    }
    const flat = flatParameters(prob, end, names);
    const which = flat.length ? flat.join(', ') : 'some parameters';
    return {
      suspect: 'start',
      reason: `from these start values the fit ran into a region where ${which} no longer ${flat.length === 1 ? 'changes' : 'change'} the model (at the start the data determine every parameter); try start values nearer the expected optimum`,
    };
  }
  if (stop === 'budget') {
    return {
      suspect: 'start',
      reason:
        'the fit was still improving when the iteration budget ran out; continue from the last iterate or raise maxIterations',
    };
  }
  return {
    suspect: 'data',
    reason:
      'no further decrease is possible yet the step does not shrink: the sum of squares is flat at the rounding level here, which points at the data (noise, scaling, or too few points where the parameters matter)',
  };
}
