/**
 * Input validation for one point: defaults for missing inputs, unit strings through
 * parseQuantity, and range checks that name the field and the allowed range. Points that are
 * merely outside a model's validity are not rejected here; the model flags them.
 */
import { ValidationError, type ErrorDetail } from '../errors.js';
import { parseQuantity } from '../units/parse.js';
import { densityFromPressure, pressureInPascal } from '../units/pressure.js';
import type { InputSpec, ModelDefinition, Thresholds } from './types.js';

function fmt(x: number): string {
  return Math.abs(x) >= 1e5 || (x !== 0 && Math.abs(x) < 1e-3) ? x.toExponential().replace('e+', 'e') : String(x);
}

function unitSuffix(spec: InputSpec): string {
  return spec.unit === '1' ? '' : ` ${spec.unit}`;
}

/** The allowed range in words, e.g. "> 0 and ≤ 1e6 eV". */
export function describeRange(spec: InputSpec): string {
  const lower = `${spec.minExclusive ? '>' : '≥'} ${fmt(spec.min)}`;
  return `${lower} and ≤ ${fmt(spec.max)}${unitSuffix(spec)}${spec.integer ? ' (a whole number)' : ''}`;
}

/** Null when `value` is acceptable for `spec`, otherwise a message naming the allowed range. */
export function checkInputValue(spec: InputSpec, value: number): string | null {
  if (typeof value !== 'number' || Number.isNaN(value)) return `${spec.name} must be a number ${describeRange(spec)}`;
  if (!Number.isFinite(value)) return `${spec.name} must be finite, ${describeRange(spec)}`;
  const belowMin = spec.minExclusive ? value <= spec.min : value < spec.min;
  if (belowMin || value > spec.max)
    return `${spec.name} must be ${describeRange(spec)}; got ${fmt(value)}${unitSuffix(spec)}`;
  if (spec.integer && !Number.isInteger(value))
    return `${spec.name} must be a whole number ${describeRange(spec)}; got ${fmt(value)}`;
  return null;
}

/**
 * Complete, canonical inputs for `model` from raw api/form values (numbers or unit strings).
 * Missing (undefined) inputs take the registry default. Throws one ValidationError listing every
 * bad field as `inputs.<name>`.
 */
export function resolveInputs(model: ModelDefinition, raw: Record<string, unknown>): Record<string, number> {
  const details: ErrorDetail[] = [];
  const known = new Set(model.inputs.map((i) => i.name));
  for (const key of Object.keys(raw ?? {})) {
    if (!known.has(key)) {
      details.push({
        path: `inputs.${key}`,
        message: `unknown input "${key}" for model ${model.id}; known inputs: ${[...known].join(', ')}`,
      });
    }
  }
  const out: Record<string, number> = {};
  const pressures: { spec: InputSpec; pPa: number }[] = [];
  for (const spec of model.inputs) {
    const path = `inputs.${spec.name}`;
    const v = raw?.[spec.name];
    if (v === undefined) {
      out[spec.name] = spec.default;
      continue;
    }
    const pPa = spec.pressureAt ? pressureInPascal(v) : null;
    if (pPa !== null) {
      pressures.push({ spec, pPa });
      continue;
    }
    let x: number;
    if (typeof v === 'number' || typeof v === 'string') {
      try {
        x = parseQuantity(path, v, spec.unit);
      } catch (err) {
        if (err instanceof ValidationError && err.details) {
          details.push(...err.details);
          continue;
        }
        throw err;
      }
    } else {
      details.push({
        path,
        message: `${spec.name} must be a number or a quantity string in ${spec.unit}, ${describeRange(spec)}`,
      });
      continue;
    }
    const msg = checkInputValue(spec, x);
    if (msg) details.push({ path, message: msg });
    else out[spec.name] = x;
  }
  // Pressures convert at their temperature input once that is known (n = p/(k_B T)).
  for (const { spec, pPa } of pressures) {
    const t = out[spec.pressureAt!];
    if (t === undefined) continue; // the temperature itself is invalid and already reported
    const x = densityFromPressure(pPa, t);
    const msg = checkInputValue(spec, x);
    if (msg)
      details.push({ path: `inputs.${spec.name}`, message: `${msg} (from ${pPa} Pa at ${spec.pressureAt} = ${t})` });
    else out[spec.name] = x;
  }
  if (details.length) {
    throw new ValidationError(
      `Invalid inputs for model ${model.id}: ${details.map((d) => d.message).join('; ')}`,
      details,
    );
  }
  return out;
}

/**
 * Thresholds for a sweep: known names only, finite and > 0; missing ones take the defaults.
 * Errors use the path `${prefix}.<name>`.
 */
export function resolveThresholds(
  model: ModelDefinition,
  raw: Record<string, unknown> | undefined,
  prefix = 'thresholds',
): Thresholds {
  const details: ErrorDetail[] = [];
  const out: Thresholds = {};
  for (const t of model.thresholds) out[t.name] = t.default;
  for (const [key, v] of Object.entries(raw ?? {})) {
    const spec = model.thresholds.find((t) => t.name === key);
    const path = `${prefix}.${key}`;
    if (!spec) {
      const names = model.thresholds.map((t) => t.name).join(', ') || 'none';
      details.push({ path, message: `unknown threshold "${key}" for model ${model.id}; known thresholds: ${names}` });
    } else if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) {
      details.push({ path, message: `${key} must be a finite number > 0 (default ${spec.default})` });
    } else {
      out[key] = v;
    }
  }
  if (details.length) throw new ValidationError(`Invalid thresholds for model ${model.id}`, details);
  return out;
}
