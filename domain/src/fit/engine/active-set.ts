import type { CompiledModel } from '../types.js';
import { reduceModel } from './fixed.js';
import type { Problem } from './problem.js';
import { refine, type RefineOutcome } from './refine.js';

/**
 * Bounds by an active set on top of the clamped optimisers. A clamped Levenberg–Marquardt step that
 * pushes into a bound keeps the coupled parameters from reaching their conditional optimum, and a
 * projected step never vanishes there. So parameters sitting on a bound are held there (as fixed
 * parameters), the rest are refined, and the Karush–Kuhn–Tucker condition is checked: each held
 * parameter's ∂RSS/∂p must point out of the box. One that points inward is released and the round repeats.
 * The result is the bounded minimiser SciPy's least_squares(bounds=…) finds (same KKT point).
 */
export function solveWithActiveBounds(
  prob: Problem,
  model: CompiledModel,
  params: Float64Array,
  budget: number,
  y: Float64Array,
  sigma: Float64Array | undefined,
  makeProblem: (m: CompiledModel, y: Float64Array, sigma: Float64Array | undefined) => Problem,
): RefineOutcome | null {
  const p = params.length;
  const atBound = (j: number) => params[j] === model.min[j] || params[j] === model.max[j];
  const released = new Set<number>();
  let used = 0;
  for (let round = 0; round <= p; round++) {
    const active = new Map<number, number>();
    for (let j = 0; j < p; j++) if (atBound(j) && !released.has(j)) active.set(j, params[j]!);
    if (active.size === 0 || active.size === p) return null;
    const reduced = reduceModel({ ...model, start: Float64Array.from(params) }, active);
    const sub = makeProblem(reduced.model, y, sigma);
    const free = Float64Array.from(reduced.model.start);
    const r = new Float64Array(sub.n);
    const jac = new Float64Array(sub.n * sub.p);
    const outcome = refine(sub, free, Math.max(1, budget - used), r, jac);
    used += outcome.iterations;
    params.set(reduced.expand(free));
    prob.clamp(params);
    if (!outcome.converged) return { ...outcome, iterations: used };
    const gradient = rssGradient(prob, params);
    const inward = [...active.keys()].filter((j) =>
      params[j] === model.max[j] ? !(gradient[j]! <= 0) : !(gradient[j]! >= 0),
    );
    const newlyAtBound = Array.from({ length: p }, (_, j) => j).some(
      (j) => atBound(j) && !active.has(j) && !released.has(j),
    );
    if (inward.length === 0 && !newlyAtBound) return { ...outcome, iterations: used };
    for (const j of inward) released.add(j);
  }
  return null;
}

/** ∂RSS/∂p_j = −2 Σ r_i·J_ij with r = w·(y − f) and J = w·∂f/∂p. */
function rssGradient(prob: Problem, params: Float64Array): Float64Array {
  const r = new Float64Array(prob.n);
  const jac = new Float64Array(prob.n * prob.p);
  prob.residuals(params, r);
  prob.jacobian(params, jac);
  const g = new Float64Array(prob.p);
  for (let j = 0; j < prob.p; j++) {
    let s = 0;
    for (let i = 0; i < prob.n; i++) s += r[i]! * jac[j * prob.n + i]!;
    g[j] = -2 * s;
  }
  return g;
}
