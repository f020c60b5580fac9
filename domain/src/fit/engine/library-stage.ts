import { levenbergMarquardt } from 'ml-levenberg-marquardt';
import { check, STEP_TOL } from './linearisation.js';
import { sumSquares, type Problem } from './problem.js';

const LIBRARY_CHUNK = 10;
/** Above this many points the library stage runs on a strided subsample (see fit-model.ts). */
export const LIBRARY_MAX_POINTS = 5_000;

/**
 * Stage 1: ml-levenberg-marquardt in a scaled space (u = p/scale, residuals divided by their
 * RMS) so its absolute damping means the same for every problem; run in chunks and stopped
 * as soon as our own step criterion holds, since its own test is an absolute RSS threshold.
 */
export function libraryStage(
  prob: Problem,
  lib: Problem,
  params: Float64Array,
  budget: number,
  r: Float64Array,
  jac: Float64Array,
): number {
  const { p, scale } = prob;
  const n = lib.n;
  const libJac = lib === prob ? jac : new Float64Array(n * p);
  let yScale = Math.sqrt(sumSquares(lib.y, lib.w) / n);
  if (!(yScale > 0) || !Number.isFinite(yScale)) yScale = 1;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = i;
    ys[i] = (lib.w[i]! * lib.y[i]!) / yScale;
  }
  const pBuf = new Float64Array(p);
  const fBuf = new Float64Array(n);
  const partials = new Array<number>(p).fill(0);
  const toParams = (u: number[]): void => {
    for (let j = 0; j < p; j++) pBuf[j] = u[j]! * scale[j]!;
  };
  // The library asks for a function per parameter vector and then calls it for each x (our index).
  const modelFn = (u: number[]) => {
    toParams(u);
    lib.model.evaluate(pBuf, fBuf);
    for (let i = 0; i < n; i++) fBuf[i] = (lib.w[i]! * fBuf[i]!) / yScale;
    return (i: number) => fBuf[i]!;
  };
  const jacobianFn = (u: number[]) => {
    toParams(u);
    lib.jacobian(pBuf, libJac);
    return (i: number) => {
      for (let j = 0; j < p; j++) partials[j] = (libJac[j * n + i]! * scale[j]!) / yScale;
      return partials;
    };
  };
  const minValues = Array.from(prob.model.min, (v, j) => v / scale[j]!);
  const maxValues = Array.from(prob.model.max, (v, j) => v / scale[j]!);
  let used = 0;
  // A start that already meets the step test (an exact log-linear start) needs no library pass.
  if (check(prob, params, r, jac, STEP_TOL).converged) return 0;
  let best = prob.residuals(params, r);
  const chunk = LIBRARY_CHUNK;
  while (used < budget) {
    const iterations = Math.min(chunk, budget - used);
    let out;
    try {
      out = levenbergMarquardt({ x: xs, y: ys }, modelFn, {
        initialValues: Array.from(params, (v, j) => v / scale[j]!),
        jacobianFunction: jacobianFn,
        minValues,
        maxValues,
        maxIterations: iterations,
        errorTolerance: 0,
        damping: 1e-2,
      });
    } catch {
      break; // e.g. a non-invertible damped matrix: leave the rest to the refinement stage
    }
    used += Math.max(out.iterations, 1);
    const candidate = Float64Array.from(out.parameterValues, (v, j) => v * scale[j]!);
    prob.clamp(candidate);
    const rss = prob.residuals(candidate, r);
    if (!(rss < best)) break; // no progress in a whole chunk
    best = rss;
    params.set(candidate);
    // On a subsample the full-data step test cannot pass: one chunk brings the start close.
    if (lib !== prob || check(prob, params, r, jac, STEP_TOL).converged) break;
  }
  return used;
}
