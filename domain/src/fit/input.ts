import { ValidationError, type ErrorDetail } from '../errors.js';
import { FIT_MODEL_KINDS, type FitInput, type Column } from './types.js';

export const DEFAULT_MAX_ITERATIONS = 500;
export const MAX_ITERATIONS_LIMIT = 100_000;

/** Data after checks: every column finite, same length, as Float64Array. */
export interface CheckedData {
  n: number;
  x: Float64Array[];
  xNames: string[];
  y: Float64Array;
  sigma?: Float64Array;
  maxIterations: number;
}

function fail(path: string, message: string): never {
  throw new ValidationError(`${path}: ${message}`, [{ path, message }]);
}

function toFinite(col: Column, path: string, n: number): Float64Array {
  if (col.length !== n) fail(path, `has ${col.length} values, y has ${n}`);
  const out = col instanceof Float64Array ? col : Float64Array.from(col);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(out[i])) fail(path, `row ${i} is not a finite number (${String(col[i])})`);
  }
  return out;
}

export function checkInput(input: FitInput): CheckedData {
  if (!FIT_MODEL_KINDS.includes(input.model)) {
    fail('model', `must be one of ${FIT_MODEL_KINDS.join(', ')}, got ${String(input.model)}`);
  }
  if (!input.y || typeof input.y.length !== 'number') fail('y', 'is required (a numeric column)');
  const n = input.y.length;
  const y = toFinite(input.y, 'y', n);
  if (!Array.isArray(input.xNames) || input.xNames.length === 0) fail('x', 'name at least one x column');
  const details: ErrorDetail[] = [];
  const seen = new Set<string>();
  for (const name of input.xNames) {
    if (!input.x || !Object.hasOwn(input.x, name)) details.push({ path: `x.${name}`, message: 'no such column' });
    if (seen.has(name)) details.push({ path: `x.${name}`, message: 'named twice' });
    seen.add(name);
  }
  if (details.length > 0) {
    throw new ValidationError(`x: ${details.map((d) => `${d.path} ${d.message}`).join('; ')}`, details);
  }
  const x = input.xNames.map((name) => toFinite(input.x[name]!, `x.${name}`, n));
  let sigma: Float64Array | undefined;
  if (input.sigma !== undefined) {
    sigma = toFinite(input.sigma, 'weights', n);
    for (let i = 0; i < n; i++) {
      if (!(sigma[i]! > 0)) fail('weights', `row ${i}: sigma must be > 0, got ${sigma[i]}`);
    }
  }
  const maxIterations = input.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  if (!Number.isInteger(maxIterations) || maxIterations < 1 || maxIterations > MAX_ITERATIONS_LIMIT) {
    fail('maxIterations', `must be an integer from 1 to ${MAX_ITERATIONS_LIMIT}, got ${maxIterations}`);
  }
  return { n, x, xNames: [...input.xNames], y, sigma, maxIterations };
}

/** Start value: an explicit `params` entry wins over the model's own guess. */
export function startValue(input: FitInput, name: string, guess: number): number {
  const given = input.params?.[name];
  if (given === undefined) return guess;
  if (!Number.isFinite(given)) fail(`params.${name}`, `start value must be a finite number, got ${given}`);
  return given;
}

/** Checks that `params` names only parameters the model has. */
export function checkParamNames(input: FitInput, names: string[]): void {
  for (const key of Object.keys(input.params ?? {})) {
    if (!names.includes(key))
      fail(
        `${input.fixed?.[key] !== undefined ? 'fixed' : 'params'}.${key}`,
        `is not a parameter of ${input.model} (parameters: ${names.join(', ')})`,
      );
  }
}

/**
 * Bounds: the model's own limits intersected with the request's. Strict lower limits
 * (γ > 0, Te > 0) are given as a tiny positive number by the model.
 */
export function resolveBounds(
  input: FitInput,
  names: string[],
  start: Float64Array,
  own: Record<string, { min?: number; max?: number }> = {},
): { min: Float64Array; max: Float64Array } {
  for (const key of Object.keys(input.bounds ?? {})) {
    if (!names.includes(key))
      fail(`bounds.${key}`, `is not a parameter of ${input.model} (parameters: ${names.join(', ')})`);
  }
  const p = names.length;
  const min = new Float64Array(p).fill(-Infinity);
  const max = new Float64Array(p).fill(Infinity);
  names.forEach((name, j) => {
    const req = input.bounds?.[name] ?? {};
    for (const [k, v] of Object.entries(req)) {
      if (k !== 'min' && k !== 'max') fail(`bounds.${name}.${k}`, 'only min and max are allowed');
      if (typeof v !== 'number' || Number.isNaN(v)) fail(`bounds.${name}.${k}`, `must be a number, got ${String(v)}`);
    }
    min[j] = Math.max(own[name]?.min ?? -Infinity, req.min ?? -Infinity);
    max[j] = Math.min(own[name]?.max ?? Infinity, req.max ?? Infinity);
    if (!(min[j]! < max[j]!)) fail(`bounds.${name}`, `min (${min[j]}) must be below max (${max[j]})`);
    // A start the model guessed (not given) moves inside the bounds; a given one outside them is an error.
    if (input.params?.[name] === undefined && input.fixed?.[name] === undefined)
      start[j] = Math.min(Math.max(start[j]!, min[j]!), max[j]!);
    if (start[j]! < min[j]! || start[j]! > max[j]!) {
      if (input.fixed?.[name] !== undefined)
        fail(`fixed.${name}`, `value ${start[j]} lies outside the parameter's range [${min[j]}, ${max[j]}]`);
      fail(`params.${name}`, `start value ${start[j]} lies outside the bounds [${min[j]}, ${max[j]}]`);
    }
  });
  return { min, max };
}

export function requireMorePointsThanParams(n: number, p: number): void {
  if (n <= p) {
    fail('y', `too few points: ${n} point(s) for ${p} parameter(s); a fit needs more points than parameters`);
  }
}

export { fail as validationFail };
