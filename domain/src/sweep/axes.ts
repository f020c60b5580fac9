import type { ErrorDetail } from '../errors.js';
import { checkInputValue } from '../models/index.js';
import type { InputSpec } from '../models/types.js';
import { densityFromPressure, parseQuantity, pressureInPascal } from '../units/index.js';
import type { SweepAxis } from './schema.js';

/** An axis with its bounds and values in canonical units. */
export interface ResolvedAxis {
  param: string;
  kind: 'linear' | 'log' | 'list';
  /** Canonical unit of the input. */
  unit: string;
  /** Bounds (canonical); for a list, the smallest and largest value. */
  min: number;
  max: number;
  /** Grid: the values along the axis (endpoints included); list axes always have them. */
  values: Float64Array | null;
  /** Number of grid values (list length for a list axis). */
  count: number;
}

function toCanonical(
  path: string,
  value: number | string,
  axisUnit: string | undefined,
  unit: string,
  errors: ErrorDetail[],
  pressureT?: number | null,
): number {
  try {
    // A number with an axis unit ("min": 1, "unit": "cm") is read in that unit.
    const given = typeof value === 'number' && axisUnit ? `${value} ${axisUnit}` : value;
    // A density axis given in pressure ("0.1 Pa") converts at the fixed gas temperature.
    const pPa = pressureT !== undefined ? pressureInPascal(given) : null;
    if (pPa !== null) {
      if (pressureT === null) {
        errors.push({
          path,
          message: `a pressure needs a fixed neutral temperature to convert at; give the value in ${unit}`,
        });
        return Number.NaN;
      }
      return densityFromPressure(pPa, pressureT!);
    }
    return parseQuantity(path, given, unit);
  } catch (err) {
    const details = (err as { details?: ErrorDetail[] }).details;
    errors.push(
      ...(details?.length ? details.map((d) => ({ ...d, path })) : [{ path, message: (err as Error).message }]),
    );
    return Number.NaN;
  }
}

/**
 * Values of a linear or log grid axis; endpoints are set exactly. A log axis is stepped in
 * log10 and a value whose exponent is an integer to within rounding is the exact power of ten
 * (1–1000 over 31 points gives exactly 10 and 100, so an equality filter on them finds the rows).
 */
export function gridValues(kind: 'linear' | 'log', min: number, max: number, count: number): Float64Array {
  const v = new Float64Array(count);
  if (count === 1) {
    v[0] = min;
    return v;
  }
  if (kind === 'linear') {
    for (let k = 0; k < count; k++) v[k] = min + ((max - min) * k) / (count - 1);
  } else {
    const a = Math.log10(min);
    const b = Math.log10(max);
    for (let k = 0; k < count; k++) {
      const t = a + ((b - a) * k) / (count - 1);
      const d = Math.round(t);
      // 10^d is exact for |d| ≤ 22; beyond that the nearest double is what `1e<d>` parses to.
      v[k] = Math.abs(t - d) <= 1e-12 * Math.max(1, Math.abs(t)) ? Number(`1e${d}`) : 10 ** t;
    }
  }
  v[0] = min;
  v[count - 1] = max;
  return v;
}

/**
 * Resolve one axis against its input spec; problems go into `errors` with paths like `axes.1.max`.
 * Returns null when the axis cannot be used.
 */
export function resolveAxis(
  axis: SweepAxis,
  i: number,
  spec: InputSpec,
  grid: boolean,
  errors: ErrorDetail[],
  /** For an input with `pressureAt`: the fixed temperature [eV] pressures convert at (null: none). */
  pressureT?: number | null,
): ResolvedAxis | null {
  const path = `axes.${i}`;
  const start = errors.length;
  const check = (p: string, value: number): void => {
    if (Number.isNaN(value)) return; // already reported by the unit parser
    const message = checkInputValue(spec, value);
    if (message) errors.push({ path: p, message });
  };

  if (axis.kind === 'list') {
    const values = new Float64Array(axis.values.length);
    axis.values.forEach((raw, k) => {
      values[k] = toCanonical(`${path}.values.${k}`, raw, axis.unit, spec.unit, errors, pressureT);
      check(`${path}.values.${k}`, values[k]!);
    });
    if (errors.length > start) return null;
    let min = Infinity;
    let max = -Infinity;
    for (const v of values) {
      if (v < min) min = v;
      if (v > max) max = v;
    }
    return { param: axis.param, kind: 'list', unit: spec.unit, min, max, values, count: values.length };
  }

  const min = toCanonical(`${path}.min`, axis.min, axis.unit, spec.unit, errors, pressureT);
  const max = toCanonical(`${path}.max`, axis.max, axis.unit, spec.unit, errors, pressureT);
  check(`${path}.min`, min);
  check(`${path}.max`, max);
  if (axis.kind === 'log') {
    if (min <= 0) errors.push({ path: `${path}.min`, message: 'must be greater than 0 on a log axis' });
    if (max <= 0) errors.push({ path: `${path}.max`, message: 'must be greater than 0 on a log axis' });
  }
  const count = grid ? (axis.count ?? 0) : 0;
  const single = grid && count === 1;
  if (!(max > min) && !(single && max === min)) {
    if (errors.length === start)
      errors.push({ path: `${path}.max`, message: `must be greater than min (${min} ${spec.unit})` });
  }
  if (spec.integer) {
    // Only a grid whose every value is whole fits an integer input; a random design never does.
    if (!grid) errors.push({ path: `${path}.kind`, message: `${spec.name} takes whole numbers: use a list axis` });
  }
  if (errors.length > start) return null;

  const values = grid ? gridValues(axis.kind, min, max, count) : null;
  if (values && spec.integer) {
    const bad = Array.from(values).find((v) => !Number.isInteger(v));
    if (bad !== undefined) {
      errors.push({
        path: `${path}.count`,
        message: `${spec.name} takes whole numbers but this axis gives ${bad}: use a list axis`,
      });
      return null;
    }
  }
  return { param: axis.param, kind: axis.kind, unit: spec.unit, min, max, values, count };
}

/** Map a unit-cube coordinate u ∈ [0,1) to an axis value (random designs). Log axes map in log space. */
export function axisValueAt(axis: ResolvedAxis, u: number): number {
  switch (axis.kind) {
    case 'linear':
      return axis.min + u * (axis.max - axis.min);
    case 'log':
      return Math.exp(Math.log(axis.min) + u * (Math.log(axis.max) - Math.log(axis.min)));
    case 'list': {
      const values = axis.values!;
      const k = Math.floor(u * values.length);
      return values[k < values.length ? k : values.length - 1]!;
    }
  }
}
